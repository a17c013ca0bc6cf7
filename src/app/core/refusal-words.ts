/** A refusal's own words for the modeller; for a schema's, the first of its messages. Nothing was saved. */
export function refusalWords(error: unknown, fallback: string): string {
  const issues = (error as { issues?: readonly { message: string }[] } | null)?.issues;
  if (issues?.[0]) return `${issues[0].message}. Nothing was saved.`;
  return error instanceof Error ? error.message : fallback;
}
