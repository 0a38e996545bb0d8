// Field-level messages for forms, from the same zod schema the server uses (checked before sending)
// or from the API's 400 `details.issues` (server/errors.ts `parse`), so a form shows the server's
// words beside the field they name.
import type { z } from 'zod';
import { ApiError } from './api.js';

export type FieldErrors = Record<string, string>;

export interface FormErrors {
  fields: FieldErrors;
  /** A message that belongs to no one field (wrong password, rate limit, network). */
  form?: string;
}

/** Checks `value` with the shared schema; returns the parsed data or the first message per field. */
export function checkForm<S extends z.ZodType>(schema: S, value: unknown): { data: z.infer<S> } | { errors: FormErrors } {
  const result = schema.safeParse(value);
  if (result.success) return { data: result.data };
  const fields: FieldErrors = {};
  for (const issue of result.error.issues) {
    const field = issue.path.join('.');
    if (field && !(field in fields)) fields[field] = sentence(issue.message);
  }
  return { errors: { fields, form: Object.keys(fields).length ? undefined : sentence(result.error.issues[0]?.message ?? 'invalid input') } };
}

/** Splits an API error into per-field messages (400 invalid_input) and a form-level message. */
export function errorsFromApi(error: unknown, knownFields: readonly string[]): FormErrors {
  if (!(error instanceof ApiError)) {
    return { fields: {}, form: 'Could not reach the server. Check your connection and try again.' };
  }
  const issues = (error.details as { issues?: { field?: string; message?: string }[] } | undefined)?.issues;
  const fields: FieldErrors = {};
  for (const issue of issues ?? []) {
    if (issue.field && knownFields.includes(issue.field) && issue.message && !(issue.field in fields)) fields[issue.field] = sentence(issue.message);
  }
  return { fields, form: Object.keys(fields).length ? undefined : sentence(error.message) };
}

/** The API speaks in lower-case fragments ("email or password is not correct"); forms show sentences. */
export function sentence(message: string): string {
  const trimmed = message.trim();
  if (!trimmed) return trimmed;
  const capital = trimmed[0].toUpperCase() + trimmed.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}
