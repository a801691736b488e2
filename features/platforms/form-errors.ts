/** zod issues to {top-level field: first message}, the shape the server's errors have. */
export function fieldsFromIssues(issues: readonly { path: readonly PropertyKey[]; message: string }[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of issues) out[String(issue.path[0] ?? '_')] ??= issue.message;
  return out;
}
