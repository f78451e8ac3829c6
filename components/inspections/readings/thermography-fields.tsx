import { FieldRow, TextField } from '@/components/ui/fields';
import { numberOrNull } from '@/components/ui/form-values';
import { Text } from '@/components/ui/text';
import type { FormBinders } from '@/components/ui/use-form-draft';
import { componentTempCheck } from '@/shared/calc';
import { componentRatingC } from '@/shared/panel-checks';
import type { Circuit, Panel } from '@/shared/schemas';
import type { ReadingDraft } from './reading-draft';

/**
 * What a thermographer records with the image — emissivity, reflected temperature, distance and
 * the camera — and the component's own temperature against what its conductor's insulation and
 * termination are rated for (NEC 110.14(C)), shown as the reading is typed.
 */
export function ThermographyFields({
  text,
  draft,
  panel,
  circuits,
}: {
  text: FormBinders<ReadingDraft>['text'];
  draft: ReadingDraft;
  panel: Panel;
  circuits: Circuit[];
}) {
  return (
    <>
      <FieldRow wrap>
        <TextField label="Emissivity" {...text('emissivity')} keyboardType="decimal-pad" mono placeholder="0.95" testID="field-emissivity" />
        <TextField label="Reflected temp. (°C)" {...text('reflectedC')} keyboardType="decimal-pad" mono testID="field-reflected" />
        <TextField label="Distance (m)" {...text('distanceM')} keyboardType="decimal-pad" mono testID="field-distance" />
      </FieldRow>
      <TextField label="Camera" {...text('camera')} testID="field-camera" />
      <ComponentTempVerdict temperature={draft.temperatureC} circuit={circuits.find((c) => c.id === draft.circuitId)} panel={panel} />
    </>
  );
}

/** "At 78 °C the component is at or above its 75 °C rating" — or why it cannot be judged. */
export function ComponentTempVerdict({ temperature, circuit, panel }: { temperature: string; circuit: Circuit | undefined; panel: Panel }) {
  const componentC = numberOrNull(temperature);
  if (componentC === null || !Number.isFinite(componentC)) return null;
  const rating = componentRatingC(circuit, panel);
  if (!rating) {
    return (
      <Text variant="small" tone="faint" testID="component-temp">
        Choose a circuit with its insulation recorded to judge the component’s own temperature against its rating.
      </Text>
    );
  }
  const check = componentTempCheck({ componentC, ratingC: rating.ratingC });
  return (
    <Text variant="small" tone={check.over ? 'danger' : 'soft'} testID="component-temp">
      {check.over ? '⚠ ' : ''}
      {check.message} ({rating.basis})
    </Text>
  );
}
