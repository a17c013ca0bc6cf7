import { changeWords, type Mutation } from '@benchtide/shared';

/** A queued change in the modeller's words: what it does, and the name or title it carries, if any. */
export function describeChange(mutation: Mutation): string {
  const words = changeWords(mutation.type);
  const data = 'data' in mutation ? (mutation.data as { name?: unknown; title?: unknown }) : {};
  const label = typeof data.name === 'string' ? data.name : typeof data.title === 'string' ? data.title : '';
  return label === '' ? words : `${words}: ${label}`;
}
