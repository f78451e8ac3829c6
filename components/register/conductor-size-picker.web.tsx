/**
 * Conductor size on the web: the browser's own select. Eighteen sizes and "not recorded" fit in
 * one control a keyboard and a screen reader already know, instead of a wall of chips.
 */
import type { CSSProperties } from 'react';
import { CONDUCTOR_SIZES, conductorSizeLabel, type ConductorSize } from '@/shared/domain';
import { Field } from '@/components/ui/fields';
import { colours, fonts, MIN_TOUCH, radii, space } from '@/components/ui/theme';
import type { ConductorSizePickerProps } from './conductor-size-picker';

const NONE = '';

export function ConductorSizePicker({ value, onChange, error, hint, label = 'Conductor size' }: ConductorSizePickerProps) {
  return (
    <Field label={label} error={error} hint={hint}>
      <select
        aria-label={label}
        aria-invalid={error ? true : undefined}
        data-testid="field-conductor-size"
        value={value ?? NONE}
        onChange={(e) => {
          const chosen = CONDUCTOR_SIZES.find((s) => s === e.target.value);
          onChange(chosen ?? null);
        }}
        style={selectStyle}
      >
        <option value={NONE}>Not recorded</option>
        {CONDUCTOR_SIZES.map((s: ConductorSize) => (
          <option key={s} value={s}>
            {conductorSizeLabel(s)}
          </option>
        ))}
      </select>
    </Field>
  );
}

// a DOM element takes CSS, not a React Native style sheet
const selectStyle: CSSProperties = {
  minHeight: MIN_TOUCH,
  maxWidth: 320,
  padding: `0 ${space.md}px`,
  borderRadius: radii.md,
  border: `1px solid ${colours.ruleStrong}`,
  backgroundColor: colours.card,
  color: colours.ink,
  fontFamily: fonts.text,
  fontSize: 16,
};
