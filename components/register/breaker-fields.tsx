import { FieldRow, TextField } from '@/components/ui/fields';
import { numberOrNull, textOf } from '@/components/ui/form-values';
import type { FormBinders } from '@/components/ui/use-form-draft';
import type { CircuitFields } from '@/shared/schemas';

/** The breaker's identity and the conductor corrections in the circuit form, as typed. */
export interface BreakerDraft {
  interruptingKA: string;
  breakerMake: string;
  catalogueNumber: string;
  ambientC: string;
  currentCarrying: string;
}

/** A device copy from before these fields existed has none: each reads as not recorded. */
export function breakerDraft(c: Partial<CircuitFields>): BreakerDraft {
  return {
    interruptingKA: textOf(c.interruptingKA),
    breakerMake: c.breakerMake ?? '',
    catalogueNumber: c.catalogueNumber ?? '',
    ambientC: textOf(c.ambientC),
    currentCarrying: textOf(c.currentCarrying),
  };
}

export function breakerValues(d: BreakerDraft) {
  return {
    interruptingKA: numberOrNull(d.interruptingKA),
    breakerMake: d.breakerMake,
    catalogueNumber: d.catalogueNumber,
    ambientC: numberOrNull(d.ambientC),
    currentCarrying: numberOrNull(d.currentCarrying),
  };
}

/**
 * Make, catalogue number and interrupting rating as marked on the breaker (NEC 110.9), and the
 * ambient and conductor count the conductor check corrects for (Tables 310.15(B)(1), (C)(1)).
 */
export function BreakerFields({ bind }: { bind: FormBinders<BreakerDraft> }) {
  const { text } = bind;
  return (
    <>
      <FieldRow wrap>
        <TextField label="Breaker make" {...text('breakerMake')} testID="field-breaker-make" />
        <TextField label="Catalogue number" {...text('catalogueNumber')} mono testID="field-catalogue" />
      </FieldRow>
      <TextField
        label="Interrupting rating (kA)"
        {...text('interruptingKA')}
        keyboardType="decimal-pad"
        mono
        hint="As marked on the breaker. It must be at least the panel’s available fault current (NEC 110.9)."
        testID="field-interrupting"
      />
      <FieldRow wrap>
        <TextField label="Ambient (°C)" {...text('ambientC')} keyboardType="decimal-pad" mono hint="Where the conductors run; blank = 30 °C" testID="field-ambient" />
        <TextField
          label="Current-carrying conductors"
          {...text('currentCarrying')}
          keyboardType="number-pad"
          mono
          hint="Together in the raceway or cable; blank = 3 or fewer"
          testID="field-current-carrying"
        />
      </FieldRow>
    </>
  );
}
