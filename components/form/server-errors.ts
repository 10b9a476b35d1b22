import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';

import type { FormProblem } from '@/components/form-alert';
import { ApiRequestError, OfflineError } from '@/lib/api-errors';

/** Words for the API's dotted paths where a form shows a problem it has no field for. */
export function pathInWords(path: string, labels: Record<string, string> = {}): string {
  const parts = path.split('.');
  const words: string[] = [];
  for (let i = 0; i < parts.length; i++) {
    const part = parts[i];
    const next = parts[i + 1];
    if (next !== undefined && /^\d+$/.test(next)) {
      words.push(`${labels[part] ?? part} ${Number(next) + 1}`);
      i++;
    } else words.push(labels[part] ?? part);
  }
  return words.join(' › ');
}

/** Which form field shows a problem at an API path, or null when the form has none for it. */
export type FieldFor = (path: string) => string | null;

/**
 * Puts a failed save's field problems (`issues[].path`) next to the fields the form has, and returns what
 * is left to show above the button.
 */
export function applyServerError<T extends FieldValues>(
  err: unknown,
  setError: UseFormSetError<T>,
  fieldFor: FieldFor,
  labels: Record<string, string> = {},
): FormProblem {
  if (err instanceof OfflineError)
    return { message: 'No connection to the server. Nothing was saved; try again when you are online.' };
  if (!(err instanceof ApiRequestError))
    return { message: 'Something went wrong. Nothing was saved; try again.' };
  const details: string[] = [];
  let placed = 0;
  for (const issue of err.issues) {
    const field = fieldFor(issue.path);
    if (field !== null) {
      // A problem deeper than the field that shows it ("noticeEmails.1") says where.
      const rest = issue.path.slice(field.length + 1);
      const where = /^\d+$/.test(rest) ? `Entry ${Number(rest) + 1}` : pathInWords(rest, labels);
      const message = field === issue.path ? issue.message : `${where}: ${issue.message}`;
      setError(field as Path<T>, { type: 'server', message }, { shouldFocus: placed === 0 });
      placed++;
    } else {
      details.push(
        issue.path === '(body)' ? issue.message : `${pathInWords(issue.path, labels)}: ${issue.message}`,
      );
    }
  }
  const message =
    err.status === 403
      ? 'Your role does not allow this change.'
      : err.status === 409 || err.issues.length === 0
        ? err.message
        : placed > 0 && details.length === 0
          ? 'Nothing was saved. Look at the fields marked below.'
          : 'Nothing was saved.';
  return { message, details };
}

/**
 * Field lookup from the form's field names. A path inside a plain field goes to that field; a path inside
 * one of `lists` (field arrays whose rows have their own inputs, "contacts.1.email") goes to that input.
 */
export function fieldsOf(names: readonly string[], lists: readonly string[] = []): FieldFor {
  return (path) => {
    const list = lists.find((l) => path.startsWith(`${l}.`));
    if (list) return path;
    return names.find((n) => path === n || path.startsWith(`${n}.`)) ?? null;
  };
}
