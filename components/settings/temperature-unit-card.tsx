/** The Me tab's choice of °C or °F for every temperature shown and typed (kept on this device). */
import { Card } from '@/components/ui/card';
import { ChoiceField } from '@/components/ui/fields';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import type { TemperatureUnit } from '@/shared/units';

const CHOICES: { value: TemperatureUnit; label: string }[] = [
  { value: 'C', label: '°C' },
  { value: 'F', label: '°F' },
];

export function TemperatureUnitCard() {
  const { unit, setUnit } = useTemperatureUnit();
  return (
    <Card testID="temperature-unit">
      <ChoiceField
        label="Temperatures in"
        choices={CHOICES}
        value={unit}
        onChange={setUnit}
        hint="Readings, rises, ambient and the printed report. Stored in °C whatever you choose; this choice is kept on this device."
      />
    </Card>
  );
}
