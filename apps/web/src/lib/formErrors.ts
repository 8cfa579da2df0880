import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { isApiError } from '../api/client';

/** Where the form shows errors that belong to no single input. */
export const FORM_ERROR = 'root.server' as const;

/**
 * Puts an API failure into a react-hook-form form: field messages next to the
 * inputs that exist in `fieldNames`, everything else in the form-level alert.
 * Returns true when at least one message landed on a field.
 */
export function applyApiError<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldNames: readonly Path<T>[],
  messages: Partial<Record<string, string>> = {},
): boolean {
  if (!isApiError(error)) {
    setError(FORM_ERROR, { type: 'server', message: 'Something unexpected went wrong. Try again.' });
    return false;
  }

  const known = new Set<string>(fieldNames);
  const leftover: string[] = [];
  let placed = false;
  let first = true;
  for (const [rawPath, fieldMessages] of Object.entries(error.fields)) {
    const message = fieldMessages.join(' ');
    // The API names body fields "body.email"; the form calls them "email".
    const path = rawPath.startsWith('body.') ? rawPath.slice('body.'.length) : rawPath;
    if (known.has(path)) {
      setError(path as Path<T>, { type: 'server', message }, { shouldFocus: first });
      first = false;
      placed = true;
    } else {
      leftover.push(message);
    }
  }

  if (!placed || leftover.length > 0) {
    const message = messages[error.code] ?? (leftover.length > 0 ? leftover.join(' ') : error.message);
    setError(FORM_ERROR, { type: error.code, message });
  }
  return placed;
}

/**
 * Only same-site paths may be used as a "go back to" target after sign-in,
 * so a crafted link cannot send someone to another site.
 */
export function safeNextPath(value: string | null | undefined): string | null {
  if (!value || !value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return null;
  return value;
}
