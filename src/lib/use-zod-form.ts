/**
 * Forms validated with the same zod schemas the server uses. `parse(form)` reads the form's fields,
 * validates them and shows field messages; `applyProblem(error)` shows a server problem's field errors
 * (by JSON Pointer) or its detail. Empty optional fields are left out.
 */
import { useCallback, useState } from 'react';
import type { z } from 'zod';
import { ApiProblem } from './api-client.ts';

export function useZodForm<S extends z.ZodType>(schema: S) {
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const focusFirstInvalid = (form: HTMLFormElement | null, fields: string[]) => {
    const first = fields.map((f) => form?.elements.namedItem(f)).find((el) => el instanceof HTMLElement) as HTMLElement | undefined;
    first?.focus();
  };

  /** Validates values assembled by the caller (for forms whose fields do not map one to one). */
  const validate = useCallback(
    (values: Record<string, unknown>, form?: HTMLFormElement | null): z.output<S> | null => {
      const result = schema.safeParse(values);
      setFormError(null);
      if (result.success) {
        setErrors({});
        return result.data;
      }
      const next: Record<string, string> = {};
      for (const issue of result.error.issues) {
        const field = String(issue.path[0] ?? '');
        if (!next[field]) next[field] = issue.message;
      }
      setErrors(next);
      focusFirstInvalid(form ?? null, Object.keys(next));
      return null;
    },
    [schema],
  );

  const parse = useCallback(
    (form: HTMLFormElement, extra: Record<string, unknown> = {}): z.output<S> | null => {
      const values: Record<string, unknown> = { ...extra };
      for (const [key, value] of new FormData(form).entries()) {
        if (typeof value === 'string' && value !== '') values[key] = value;
      }
      const result = schema.safeParse(values);
      setFormError(null);
      if (result.success) {
        setErrors({});
        return result.data;
      }
      const next: Record<string, string> = {};
      for (const issue of result.error.issues) {
        const field = String(issue.path[0] ?? '');
        if (!next[field]) next[field] = issue.message;
      }
      setErrors(next);
      focusFirstInvalid(form, Object.keys(next));
      return null;
    },
    [schema],
  );

  const applyProblem = useCallback((error: unknown, form?: HTMLFormElement | null) => {
    if (!(error instanceof ApiProblem)) {
      setFormError('Something went wrong. Try again.');
      return;
    }
    const fields = error.fieldErrors;
    // Messages for fields this form does not have (a link's token, say) are shown as the form's message.
    const shown = Object.keys(fields).filter((f) => !form || form.elements.namedItem(f));
    setErrors(fields);
    setFormError(shown.length ? null : error.message);
    if (shown.length) focusFirstInvalid(form ?? null, shown);
  }, []);

  const reset = useCallback(() => {
    setErrors({});
    setFormError(null);
  }, []);

  return { errors, formError, parse, validate, applyProblem, reset };
}
