import type { ZodError } from 'zod';

export interface FieldIssue {
  /** Dotted path to the field, e.g. `boundaries.3.stiffening.spacing`; `(root)` for the whole value. */
  path: string;
  message: string;
}

/**
 * Turns a zod error into a flat list of `path: message` pairs a person can act on. The one way
 * Brineline words a zod issue: the API's field details, the import list, the CLI and the server's
 * own refusals all use it, so a path reads the same everywhere.
 */
export function formatZodIssues(error: ZodError): FieldIssue[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(root)',
    message: issue.message,
  }));
}

/** One human-readable line per problem: "path: message". */
export function formatIssueLines(error: ZodError): string[] {
  return formatZodIssues(error).map((i) => `${i.path}: ${i.message}`);
}
