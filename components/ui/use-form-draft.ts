import { useState } from 'react';

/**
 * A form's draft and its field errors. Editing a field clears that field's error, so the ✕ goes
 * away as soon as the user starts fixing it.
 */
export function useFormDraft<T extends object>(initial: () => T) {
  const [draft, setDraft] = useState<T>(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const set =
    <K extends keyof T>(key: K) =>
    (value: T[K]) => {
      setDraft((d) => ({ ...d, [key]: value }));
      setErrors(({ [key as string]: _dropped, ...rest }) => rest);
    };
  return { draft, set, errors, setErrors };
}
