import type { ZodError } from 'zod';

export interface FieldIssue {
  /** Dotted path to the field, e.g. `boundaries.3.stiffening.spacing`. */
  path: string;
  message: string;
}

/** Turns a zod error into a flat list of `path: message` pairs a person can act on. */
export function formatZodIssues(error: ZodError): FieldIssue[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join('.') || '(root)',
    message: issue.message,
  }));
}
