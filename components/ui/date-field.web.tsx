/**
 * A calendar date on the web: the browser's own `<input type="date">`. It opens the phone's
 * calendar, is read out as a date by screen readers, takes the keyboard, and its value is always
 * YYYY-MM-DD or empty (a half-typed date is empty), so forms keep their one date format.
 */
import { Field } from './fields';
import { colours, fonts, MIN_TOUCH, radii, space } from './theme';
import type { DateFieldProps } from './date-field';

export type { DateFieldProps } from './date-field';

export function DateField({ label, value, onChangeText, error, hint, required, min, max, testID }: DateFieldProps) {
  return (
    <Field label={label} error={error} hint={hint} required={required}>
      <input
        type="date"
        value={value}
        min={min}
        max={max}
        onChange={(e) => onChangeText(e.currentTarget.value)}
        aria-label={label}
        aria-required={required}
        aria-invalid={!!error}
        data-testid={testID}
        style={error ? { ...look, ...errorLook } : look}
      />
    </Field>
  );
}

// plain CSS for a plain element: the theme's colours are CSS variables on the web
const look = {
  boxSizing: 'border-box',
  width: '100%',
  minHeight: MIN_TOUCH,
  borderWidth: 1,
  borderStyle: 'solid',
  borderColor: colours.ruleStrong,
  borderRadius: radii.md,
  backgroundColor: colours.card,
  color: colours.ink,
  paddingLeft: space.md,
  paddingRight: space.md,
  fontFamily: fonts.mono,
  fontSize: 17,
} as const;
const errorLook = { borderColor: colours.danger, borderWidth: 2 } as const;

