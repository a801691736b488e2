import { useState } from 'react';
import type { z } from 'zod';
import { ApiError } from '../api/client';

/**
 * Form state checked with the same shared/ schema the server uses; server-side
 * field errors land beside the same inputs.
 */
export function useForm<S extends z.ZodObject>(schema: S, initial: Record<keyof z.input<S>, string>) {
  const [values, setValues] = useState(initial);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const set = (key: keyof z.input<S>) => (text: string) => setValues((v) => ({ ...v, [key]: text }));

  async function submit(action: (data: z.infer<S>) => Promise<void>) {
    const parsed = schema.safeParse(values);
    if (!parsed.success) {
      const errs: Record<string, string> = {};
      for (const issue of parsed.error.issues) errs[String(issue.path[0])] ??= issue.message;
      setFieldErrors(errs);
      setFormError(null);
      return;
    }
    setFieldErrors({});
    setFormError(null);
    setBusy(true);
    try {
      await action(parsed.data);
    } catch (err) {
      if (err instanceof ApiError) {
        setFieldErrors(err.fields);
        setFormError(err.message);
      } else setFormError('Something went wrong. Try again.');
    } finally {
      setBusy(false);
    }
  }

  return { values, set, fieldErrors, formError, busy, submit, setFormError };
}
