/**
 * Parts of the reading form added for the judgements of issue 13: the screw kinds of UL 486A-486B
 * with the slot length or socket size some of them need, the warning to check a maker's value far
 * above the table (shown before tightening), and the "taken during a test pulse" choice of a
 * thermal reading.
 */
import { makerValueWarning, type TorqueUnit } from '@/shared/calc';
import type { ConductorSize } from '@/shared/domain';
import { SLOT_LENGTHS_MM, SOCKET_SIZES_IN, type ReadingFields, type TORQUE_SCREWS } from '@/shared/records';

type ScrewSize = ReadingFields['screwSize'];
import { ChoiceField } from '@/components/ui/fields';
import { numberOrNull } from '@/components/ui/form-values';
import { Text } from '@/components/ui/text';

type Screw = (typeof TORQUE_SCREWS)[number];

export const SCREW_LABELS: Record<Screw, string> = {
  'slotted-small': 'Small slotted (No. 10+)',
  'slotted-large': 'Large slotted (No. 10+)',
  'split-bolt': 'Split-bolt',
  hex: 'Other hex head',
  'slotted-under-10-narrow': 'Slotted under No. 10, slot < 1.2 mm',
  'slotted-under-10-wide': 'Slotted under No. 10, slot ≥ 1.2 mm',
  socket: 'Hex socket (set screw)',
};
export const SCREW_HINT =
  'Slotted screws and slotted set screws: small slotted is a slot up to 1.2 mm wide and 6.4 mm long. ' +
  'Screws smaller than No. 10 are for 8 AWG and smaller (UL 486A-486B Table I.2); hex socket set screws go by ' +
  'the key size (Table I.3).';

/** The slot length (slotted under No. 10) or socket size (hex socket) the table needs; nothing otherwise. */
export function ScrewSizeField({
  screw,
  value,
  onChange,
  error,
}: {
  screw: Screw | null;
  value: ScrewSize;
  onChange: (value: ScrewSize) => void;
  error?: string;
}) {
  if (screw === 'socket') {
    return (
      <ChoiceField
        label="Socket size across flats (in)"
        choices={SOCKET_SIZES_IN.map((s) => ({ value: s as ScrewSize, label: `${s} in` }))}
        value={value}
        onChange={onChange}
        error={error}
      />
    );
  }
  if (screw === 'slotted-under-10-narrow' || screw === 'slotted-under-10-wide') {
    return (
      <ChoiceField
        label="Slot length (mm)"
        choices={SLOT_LENGTHS_MM.map((s) => ({ value: s as ScrewSize, label: s === '<4' ? 'under 4 mm' : `${s} mm` }))}
        value={value}
        onChange={onChange}
        error={error}
        hint="Measured at the bottom of the slot. Longer slots: use the maker’s value."
      />
    );
  }
  return null;
}

/** Shown as soon as the value, wire and screw are known — before the screw is tightened. */
export function MakerValueCheck(props: {
  specified: string;
  unit: TorqueUnit;
  size: ConductorSize | null;
  screw: Screw | null;
  screwSize: ScrewSize;
}) {
  const specified = numberOrNull(props.specified);
  if (specified === null || !Number.isFinite(specified) || !(specified > 0)) return null;
  const warning = makerValueWarning({ ...props, specified });
  if (warning === null) return null;
  return (
    <Text variant="small" tone="warn" testID="maker-value-warning">
      ⚠ {warning}
    </Text>
  );
}

export function TestPulseField({ value, onChange }: { value: boolean; onChange: (value: boolean) => void }) {
  return (
    <ChoiceField
      label="Taken"
      choices={[
        { value: false, label: 'Under steady load' },
        { value: true, label: 'During a test pulse (e.g. a trip test)' },
      ]}
      value={value}
      onChange={onChange}
      hint="A pulse of seconds is not thermal steady state: the raw difference is judged, with no load correction."
    />
  );
}
