import { randomUUID } from 'node:crypto';
import { mkdir, open, rename, rm, type FileHandle } from 'node:fs/promises';
import { dirname, resolve, sep } from 'node:path';
import { checkedKey, type PhotoStore } from './photo-store.js';

/**
 * Photos as files under one folder. Each is written to a temporary file beside its place and
 * renamed into it, so a crash mid-write leaves no half photo under a real key. The disk keeps
 * bytes only: every copy the app stores has one known type.
 */
export function diskPhotoStore(root: string): PhotoStore {
  const base = resolve(root);
  const pathOf = (key: string) => {
    const path = resolve(base, checkedKey(key));
    if (!path.startsWith(base + sep)) throw new Error(`Not a photo store key: ${JSON.stringify(key)}`);
    return path;
  };

  return {
    async put(key, bytes) {
      const path = pathOf(key);
      await mkdir(dirname(path), { recursive: true });
      const temporary = `${path}.${randomUUID()}.tmp`;
      try {
        const file = await open(temporary, 'wx');
        try {
          await file.writeFile(bytes);
          await file.sync();
        } finally {
          await file.close();
        }
        await rename(temporary, path);
      } catch (error) {
        await rm(temporary, { force: true });
        throw error;
      }
    },

    async get(key) {
      let file: FileHandle;
      try {
        file = await open(pathOf(key), 'r');
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw error;
      }
      try {
        const { size } = await file.stat();
        return { body: file.createReadStream(), bytes: size };
      } catch (error) {
        await file.close();
        throw error;
      }
    },

    async remove(key) {
      await rm(pathOf(key), { force: true });
    },
  };
}
