import type * as z from 'zod';

/**
 * The shared schema's first message for each field, by the field's path ("sizeQty", "dataSheet.potLifeMin"),
 * so each shows beside the field it is about.
 */
export function fieldMessages(result: z.ZodSafeParseResult<unknown>): Map<string, string> {
  const messages = new Map<string, string>();
  if (result.success) return messages;
  for (const issue of result.error.issues) {
    const path = issue.path.map(String).join('.');
    if (!messages.has(path)) messages.set(path, issue.message);
  }
  return messages;
}

/** What a field says when it held a value and was emptied: the record keeps a value once it has one. */
export function keptOnceSet(label: string, instead: string): string {
  return `${label} cannot be emptied once set: ${instead}`;
}
