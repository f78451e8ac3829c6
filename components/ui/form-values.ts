/** Text-box values to typed values: '' is "not recorded", anything else must read as a number. */
export function numberOrNull(text: string): number | null {
  const trimmed = text.trim().replace(/,/g, '');
  if (trimmed === '') return null;
  const value = Number(trimmed);
  // NaN passes through on purpose: the zod schema then names the field ("must be a number")
  return value;
}

export function textOf(value: number | null | undefined): string {
  return value === null || value === undefined ? '' : String(value);
}

/** Only the fields that differ from what was loaded: a patch names what changed. */
export function changedFields<T extends Record<string, unknown>>(before: Partial<T>, after: T): Partial<T> {
  const patch: Partial<T> = {};
  for (const key of Object.keys(after) as (keyof T)[]) {
    if (after[key] !== before[key]) patch[key] = after[key];
  }
  return patch;
}
