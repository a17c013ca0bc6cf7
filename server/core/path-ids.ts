import * as z from 'zod';
import { AppError } from './app-error.js';

const uuid = z.uuid();

/** A path id that is not a UUID names nothing: 404, never a database error. */
export function pathId(value: string | string[] | undefined): string {
  if (typeof value !== 'string' || !uuid.safeParse(value).success) {
    throw new AppError(404, 'not_found', 'There is nothing at this address.');
  }
  return value;
}
