import type { z } from 'zod'

/** "email: Invalid email address; password: Too small…" — readable on both sides. */
export function describeIssues(issues: readonly z.core.$ZodIssue[]): string {
  return issues
    .slice(0, 5)
    .map(i => (i.path.length ? `${i.path.map(String).join('.')}: ` : '') + i.message)
    .join('; ')
}
