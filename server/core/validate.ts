import type * as z from 'zod';
import { AppError } from './app-error.js';

/** Parses a request body with a shared schema; a bad one becomes a 400 naming each field. */
export function validate<Schema extends z.ZodType>(schema: Schema, body: unknown): z.output<Schema> {
  // A field without its own message would otherwise read "expected string, received undefined".
  const parsed = schema.safeParse(body ?? {}, {
    error: (issue) => (issue.code === 'invalid_type' && issue.input === undefined ? 'This is required' : undefined),
  });
  if (parsed.success) return parsed.data;
  const fields: Record<string, string> = {};
  for (const issue of parsed.error.issues) {
    const path = issue.path.map(String).join('.') || 'body';
    fields[path] ??= issue.message;
  }
  throw new AppError(400, 'invalid', 'Some values need another look.', fields);
}
