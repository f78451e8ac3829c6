import { ChoiceField } from './fields';
import { useTheme } from './theme-provider';
import type { ThemePreference } from './theme-preference';

const CHOICES: { value: ThemePreference; label: string }[] = [
  { value: 'system', label: 'Follow this device' },
  { value: 'light', label: 'Light' },
  { value: 'dark', label: 'Dark (high contrast)' },
];

/** The Me tab's theme switch; the choice stays on this device. */
export function ThemeChoice() {
  const { preference, choose } = useTheme();
  return (
    <ChoiceField
      label="Theme"
      hint="Dark is easier on the eyes in a dim electrical room. Kept on this device."
      choices={CHOICES}
      value={preference}
      onChange={choose}
    />
  );
}
