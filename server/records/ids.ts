import { v7 } from 'uuid';

/** Time-ordered ids (UUID v7) for records the server itself makes, like a pour's stock uses. */
export const uuidv7 = (): string => v7();
