import { resolve } from 'node:path';

export interface ServerConfig {
  port: number;
  host: string;
  databaseUrl: string;
  production: boolean;
  logLevel: string;
  /** Folder of the production build of the app; the API runs without it. */
  appDir: string;
  /**
   * How many proxies in front of the server to believe about the client's address and protocol:
   * 0 for none, 1 for one load balancer. Only the addresses those proxies added are believed, so a
   * client cannot pick its own address (and its own sign-in limit) by sending X-Forwarded-For.
   */
  trustProxy: number;
  /** The address people reach the app at; links in e-mails point there. */
  publicOrigin: string;
  /** Session cookies are Secure when the app is served over HTTPS. */
  secureCookies: boolean;
  smtpUrl: string;
  mailFrom: string;
  /** Where bench photos are kept: a folder on this machine, or any S3-compatible bucket. */
  photoStore: PhotoStoreConfig;
}

export type PhotoStoreConfig =
  | { kind: 'disk'; dir: string }
  | {
      kind: 's3';
      bucket: string;
      region: string;
      /** Absent for AWS itself; the address of any other S3-compatible service. */
      endpoint?: string;
      forcePathStyle: boolean;
      /** Absent to let the SDK find credentials itself (instance role, shared profile). */
      credentials?: { accessKeyId: string; secretAccessKey: string };
    };

const DEFAULT_DATABASE_URL = 'postgres://benchtide@127.0.0.1:54329/benchtide';

export function readConfig(env: NodeJS.ProcessEnv = process.env): ServerConfig {
  const port = Number(env['PORT'] ?? 3000);
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    throw new Error(`PORT must be a whole number from 0 to 65535, not "${env['PORT']}"`);
  }
  return {
    port,
    host: env['HOST'] ?? '127.0.0.1',
    databaseUrl: env['DATABASE_URL'] ?? DEFAULT_DATABASE_URL,
    production: env['NODE_ENV'] === 'production',
    logLevel: env['LOG_LEVEL'] ?? 'info',
    appDir: resolve(env['BENCHTIDE_APP_DIR'] ?? 'dist/benchtide/browser'),
    trustProxy: readTrustProxy(env['TRUST_PROXY']),
    publicOrigin: (env['PUBLIC_ORIGIN'] ?? `http://${env['HOST'] ?? '127.0.0.1'}:${port}`).replace(/\/$/, ''),
    secureCookies: (env['PUBLIC_ORIGIN'] ?? '').startsWith('https://'),
    smtpUrl: env['SMTP_URL'] ?? 'smtp://127.0.0.1:2525',
    mailFrom: env['MAIL_FROM'] ?? 'Benchtide <no-reply@benchtide.test>',
    photoStore: readPhotoStore(env),
  };
}

function readTrustProxy(value = ''): number {
  if (!/^\d*$/.test(value)) {
    throw new Error(`TRUST_PROXY must be the number of proxies in front of the server, such as 1, not "${value}"`);
  }
  return Number(value || 0);
}

function readPhotoStore(env: NodeJS.ProcessEnv): PhotoStoreConfig {
  const kind = env['PHOTO_STORE'] ?? 'disk';
  if (kind === 'disk') return { kind, dir: resolve(env['PHOTO_DIR'] ?? '.data/photos') };
  if (kind !== 's3') throw new Error(`PHOTO_STORE must be disk or s3, not "${kind}"`);
  const bucket = env['S3_BUCKET'];
  if (!bucket) throw new Error('PHOTO_STORE=s3 needs S3_BUCKET, the bucket photos are kept in');
  const [accessKeyId, secretAccessKey] = [env['S3_ACCESS_KEY_ID'], env['S3_SECRET_ACCESS_KEY']];
  if (Boolean(accessKeyId) !== Boolean(secretAccessKey)) {
    throw new Error('Give S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY together, or neither');
  }
  const endpoint = env['S3_ENDPOINT'] || undefined;
  const pathStyle = env['S3_FORCE_PATH_STYLE'];
  return {
    kind,
    bucket,
    region: env['S3_REGION'] ?? 'us-east-1',
    endpoint,
    // Self-hosted stores usually answer on one host name, without a name per bucket.
    forcePathStyle: pathStyle === undefined ? endpoint !== undefined : pathStyle === '1',
    credentials: accessKeyId && secretAccessKey ? { accessKeyId, secretAccessKey } : undefined,
  };
}
