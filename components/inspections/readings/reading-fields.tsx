/**
 * The fields of each kind of reading: a thermal reading, a torque check, a trip test by primary
 * injection. The form (reading-form.tsx) owns the draft, the checks and the save.
 */
import { StyleSheet, View } from 'react-native';
import { SYSTEM_INFO, conductorSizeLabel } from '@/shared/domain';
import {
  READING_PHASES,
  THERMAL_COMPONENTS,
  THERMAL_COMPONENT_LABELS,
  TORQUE_SCREWS,
  TORQUE_UNITS,
  type Band,
} from '@/shared/records';
import type { Circuit, Panel } from '@/shared/schemas';
import { breakerLabel } from '@/components/register/circuit-format';
import { ConductorSizePicker } from '@/components/register/conductor-size-picker';
import { ChoiceField, FieldRow, TextField } from '@/components/ui/fields';
import { numberOrNull } from '@/components/ui/form-values';
import { fallbackIn, type ReadingDraft } from './reading-draft';
import { ReadingCircuitPicker } from './reading-circuit-picker';
import { MakerValueCheck, SCREW_HINT, SCREW_LABELS, ScrewSizeField, TestPulseField } from './reading-extras';
import { Text } from '@/components/ui/text';
import { ThermographyFields } from './thermography-fields';
import type { DraftSetter, FormBinders } from '@/components/ui/use-form-draft';
import { colours, radii, space } from '@/components/ui/theme';
import { tempInputText, unitSymbol } from '@/shared/units';


interface KindFieldsProps {
  draft: ReadingDraft;
  set: DraftSetter<ReadingDraft>;
  text: FormBinders<ReadingDraft>['text'];
  field: FormBinders<ReadingDraft>['field'];
  errors: Record<string, string>;
  panel: Panel;
  circuits: Circuit[];
}

// ---------- thermal ----------

export function ThermalFields({ draft, set, errors, text, field, panel, circuits, ambientC }: KindFieldsProps & { ambientC: number | null }) {
  const phases = READING_PHASES.filter((p) => p !== 'C' || SYSTEM_INFO[panel.system].phases === 3);
  const chooseBasis = (basis: ReadingDraft['referenceBasis']) => {
    set('referenceBasis')(basis);
    // over ambient air: the inspection already knows the air temperature
    if (basis === 'ambient' && !draft.referenceC.trim() && ambientC !== null) set('referenceC')(tempInputText(ambientC, draft.temperatureUnit, 'absolute'));
  };
  return (
    <>
      <ChoiceField
        label="Component"
        choices={THERMAL_COMPONENTS.map((value) => ({ value, label: THERMAL_COMPONENT_LABELS[value] }))}
        {...field('component')}
      />
      <ChoiceField
        label="Phase"
        choices={[{ value: null, label: 'Not recorded' }, ...phases.map((p) => ({ value: p, label: p === 'N' ? 'Neutral' : p }))]}
        {...field('phase')}
      />
      <ReadingCircuitPicker
        label="Circuit (optional)"
        circuits={circuits}
        {...field('circuitId')}
        noneLabel="No circuit: bus, main lugs or the enclosure"
        testID="field-circuit"
      />
      <FieldRow wrap>
        <TextField
          label={`Temperature (${unitSymbol(draft.temperatureUnit)})`}
          {...text('temperatureC')}
          keyboardType="decimal-pad"
          mono
          testID="field-temperature"
        />
        <TextField
          label={`Reference (${unitSymbol(draft.temperatureUnit)})`}
          {...text('referenceC')}
          keyboardType="decimal-pad"
          mono
          testID="field-reference"
        />
      </FieldRow>
      <ChoiceField
        label="Reference is"
        choices={[
          { value: 'similar' as const, label: 'A similar component' },
          { value: 'ambient' as const, label: 'Ambient air' },
        ]}
        value={draft.referenceBasis}
        onChange={chooseBasis}
        error={errors.referenceBasis}
        hint="NETA judges a rise over a similar component under similar load more strictly than a rise over the air."
      />
      <FieldRow wrap>
        <TextField
          label="Measured load (A)"
          {...text('loadA')}
          keyboardType="decimal-pad"
          mono
          testID="field-load-a"
        />
        <TextField
          label="Reference load (A)"
          {...text('referenceLoadA')}
          keyboardType="decimal-pad"
          mono
          testID="field-reference-load-a"
        />
      </FieldRow>
      {!errors.loadA && !errors.referenceLoadA && (
        <Text variant="small" tone="faint">
          Optional, both or neither: a rise taken between 40 % and 100 % of the reference load is raised to it; one
          taken at or above it is never lowered; under 40 % it is too lightly loaded to judge (NFPA 70B).
        </Text>
      )}
      <TestPulseField {...field('duringTestPulse')} />
      <ThermographyFields text={text} draft={draft} panel={panel} circuits={circuits} />
    </>
  );
}

// ---------- torque ----------


export function TorqueFields({ draft, set, errors, text, field, circuits }: KindFieldsProps) {
  const unit = draft.unit ?? 'lbf-in';
  const table = fallbackIn(unit, draft.conductorSize, draft.screw, draft.screwSize);
  const usesTable = draft.specSource === 'fallback-table';
  /** under the fallback, the specified value follows the table for the size, screw and unit chosen */
  const follow = (next: Partial<Pick<ReadingDraft, 'unit' | 'conductorSize' | 'screw' | 'screwSize' | 'specSource'>>) => {
    const source = next.specSource ?? draft.specSource;
    if (source !== 'fallback-table') return;
    const value = fallbackIn(next.unit ?? unit, next.conductorSize ?? draft.conductorSize, next.screw ?? draft.screw, next.screwSize ?? draft.screwSize);
    if (value !== null) set('specified')(String(value));
  };
  const chooseCircuit = (id: string | null) => {
    set('circuitId')(id);
    const circuit = circuits.find((c) => c.id === id);
    // the wire on the terminal is usually the circuit's conductor
    if (circuit?.conductorSize && !draft.conductorSize) {
      set('conductorSize')(circuit.conductorSize);
      follow({ conductorSize: circuit.conductorSize });
    }
  };
  return (
    <>
      <ReadingCircuitPicker
        label="Termination"
        circuits={circuits}
        value={draft.circuitId}
        onChange={chooseCircuit}
        noneLabel="Main lugs / main breaker"
        error={errors.circuitId}
        testID="field-circuit"
      />
      <TextField
        label="Fastener"
        {...text('fastener')}
        placeholder={draft.circuitId ? 'e.g. load terminal' : 'e.g. phase B line lug'}
        hint="Which screw or lug, so the next check finds the same one."
        testID="field-fastener"
      />
      <ChoiceField
        label="Specified value comes from"
        choices={[
          { value: 'maker' as const, label: 'Maker’s instructions' },
          { value: 'fallback-table' as const, label: 'Fallback table (UL 486A-B)' },
        ]}
        value={draft.specSource}
        onChange={(v) => {
          set('specSource')(v);
          follow({ specSource: v ?? undefined });
        }}
        error={errors.specSource}
      />
      <ConductorSizePicker
        label={usesTable ? 'Conductor size' : 'Conductor size (optional: checks the value against the table)'}
        value={draft.conductorSize}
        onChange={(v) => {
          set('conductorSize')(v);
          follow({ conductorSize: v ?? undefined });
        }}
        error={errors.conductorSize}
      />
      <ChoiceField
        label={usesTable ? 'Screw kind' : 'Screw kind (optional)'}
        choices={TORQUE_SCREWS.map((value) => ({ value, label: SCREW_LABELS[value] }))}
        value={draft.screw}
        onChange={(v) => {
          set('screw')(v);
          follow({ screw: v ?? undefined });
        }}
        error={errors.screw}
        hint={SCREW_HINT}
      />
      <ScrewSizeField
        screw={draft.screw}
        value={draft.screwSize}
        onChange={(v) => {
          set('screwSize')(v);
          follow({ screwSize: v ?? undefined });
        }}
        error={errors.screwSize}
      />
      {usesTable && (
        <View style={styles.fallback} testID="torque-fallback">
          <Text variant="label" tone="warn">UL 486A-B FALLBACK (AS PRINTED IN NEC ANNEX I)</Text>
          {table !== null ? (
            <Text variant="reading">
              {table} {unit} for {draft.conductorSize ? conductorSizeLabel(draft.conductorSize) : '?'},{' '}
              {draft.screw ? SCREW_LABELS[draft.screw].toLowerCase() : '?'}
            </Text>
          ) : (
            <Text variant="small">
              {draft.conductorSize && draft.screw
                ? 'The table has no value for this screw and wire size: use the maker’s value.'
                : 'Choose the conductor size and the screw kind to fill the value from the table.'}
            </Text>
          )}
          <Text variant="small">
            The maker’s value governs wherever it is given (NEC 110.14(D)): use the table only when the equipment and its
            instructions give none.
          </Text>
        </View>
      )}
      <ChoiceField
        label="Unit"
        choices={TORQUE_UNITS.map((u) => ({ value: u, label: u }))}
        value={draft.unit}
        onChange={(v) => {
          set('unit')(v);
          follow({ unit: v ?? undefined });
        }}
        error={errors.unit}
      />
      <TextField
        label={`Specified torque (${unit})`}
        {...text('specified')}
        keyboardType="decimal-pad"
        mono
        hint={usesTable && table !== null ? 'Filled from the UL 486A-B table: change it only to the maker’s figure.' : undefined}
        testID="field-specified"
      />
      <MakerValueCheck specified={draft.specified} unit={unit} size={draft.conductorSize} screw={draft.screw} screwSize={draft.screwSize} />
      <ChoiceField
        label="As found"
        choices={[
          { value: 'held' as const, label: 'Held at the value' },
          { value: 'turned' as const, label: 'Turned' },
        ]}
        {...field('asFound')}
        hint="Held: it did not move at the specified torque. Turned: it moved before reaching it."
      />
      <FieldRow wrap>
        {draft.asFound === 'turned' && (
          <TextField
            label={`Turned at (${unit})`}
            {...text('asFoundValue')}
            keyboardType="decimal-pad"
            mono
            testID="field-as-found"
          />
        )}
        <TextField
          label={`As left (${unit})`}
          {...text('asLeft')}
          keyboardType="decimal-pad"
          mono
          testID="field-as-left"
        />
      </FieldRow>
    </>
  );
}

// ---------- trip test ----------

export function TripFields({ draft, text, field, circuits, bands }: KindFieldsProps & { bands: Band[] | undefined }) {
  const breakers = circuits.filter((c) => c.status !== 'space');
  const circuit = breakers.find((c) => c.id === draft.circuitId) ?? null;
  const ratingA = circuit?.ratingA ?? null;
  const testA = numberOrNull(draft.testCurrentA);
  const circuitBand = circuit?.bandId ? bands?.find((b) => b.id === circuit.bandId) : undefined;
  const pct = ratingA && testA && Number.isFinite(testA) ? Math.round((100 * testA) / ratingA) : null;
  const bandChoices = [
    {
      value: null,
      label: circuitBand ? `The circuit’s band: ${circuitBand.label}` : circuit?.bandId ? 'The circuit’s band (not on this device)' : 'None: NETA 300 % fallback only',
    },
    ...(bands ?? [])
      .filter((b) => b.id !== circuit?.bandId)
      .map((b) => ({ value: b.id as string | null, label: `${b.label} (${b.ratingA} A)` })),
  ];
  const chosenBand = draft.bandId ? bands?.find((b) => b.id === draft.bandId) : undefined;
  return (
    <>
      <ReadingCircuitPicker
        label="Circuit tested"
        circuits={breakers}
        {...field('circuitId')}
        detail={(c) => breakerLabel(c)}
        hint={circuit ? (ratingA ? `Trip rating ${ratingA} A (${breakerLabel(circuit)})` : 'This circuit has no trip rating recorded: add it on the schedule to judge the test.') : undefined}
        testID="field-circuit"
      />
      <TextField
        label="Test current (A)"
        {...text('testCurrentA')}
        keyboardType="decimal-pad"
        mono
        hint={pct !== null ? `${pct} % of the ${ratingA} A rating` : ratingA ? `300 % of the ${ratingA} A rating is ${ratingA * 3} A` : undefined}
        testID="field-test-current"
      />
      <ChoiceField
        label="Did it trip?"
        choices={[
          { value: true, label: 'Tripped' },
          { value: false, label: 'Did not trip' },
        ]}
        {...field('tripped')}
      />
      {draft.tripped === true && (
        <TextField
          label="Time to trip (s)"
          {...text('tripTimeS')}
          keyboardType="decimal-pad"
          mono
          testID="field-trip-time"
        />
      )}
      <ChoiceField
        label="Time-current band"
        choices={bandChoices}
        {...field('bandId')}
        hint={
          chosenBand && ratingA && chosenBand.ratingA !== ratingA
            ? `This band is for a ${chosenBand.ratingA} A breaker; the circuit is ${ratingA} A.`
            : 'Bands come from the maker’s published curve (Me → Band library). Without one, only a 300 % test can be judged, against the NETA table.'
        }
      />
    </>
  );
}

const styles = StyleSheet.create({
  fallback: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radii.md,
    borderWidth: 1,
    borderColor: colours.warn,
    backgroundColor: colours.warnSoft,
  },
});
