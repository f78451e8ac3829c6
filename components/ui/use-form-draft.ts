import { useState } from 'react';

/** Sets one field of a draft: `set('position')(text)`. */
export type DraftSetter<T> = <K extends keyof T>(key: K) => (value: T[K]) => void;

/**
 * A form's fields bound to its draft: `<TextField label="…" {...text('notes')} />` and
 * `<ChoiceField label="…" choices={…} {...field('status')} />` give the control its value, its
 * change handler and its ✕ error, so a form names each field once.
 */
export function bindForm<T>(draft: T, set: DraftSetter<T>, errors: Record<string, string>) {
  return {
    /** for a text box (TextField) */
    text: <K extends keyof T>(key: K) => ({ value: draft[key], onChangeText: set(key), error: errors[String(key)] }),
    /** for a chooser (ChoiceField, ToggleField, pickers with value/onChange/error) */
    field: <K extends keyof T>(key: K) => ({ value: draft[key], onChange: set(key), error: errors[String(key)] }),
  };
}

export type FormBinders<T> = ReturnType<typeof bindForm<T>>;

/**
 * A form's draft and its field errors. Editing a field clears that field's error, so the ✕ goes
 * away as soon as the user starts fixing it.
 */
export function useFormDraft<T extends object>(initial: () => T) {
  const [draft, setDraft] = useState<T>(initial);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const set: DraftSetter<T> = (key) => (value) => {
    setDraft((d) => ({ ...d, [key]: value }));
    setErrors(({ [String(key)]: _dropped, ...rest }) => rest);
  };
  return { draft, set, errors, setErrors, ...bindForm(draft, set, errors) };
}
