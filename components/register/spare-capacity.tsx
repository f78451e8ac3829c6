import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceField, FieldRow, TextField, ToggleField } from '@/components/ui/fields';
import { numberOrNull } from '@/components/ui/form-values';
import { Text } from '@/components/ui/text';
import { colours, radii, space } from '@/components/ui/theme';
import { spareCapacity, type SpareCapacity } from '@/shared/calc';
import { SYSTEM_INFO } from '@/shared/domain';
import { peakDemandA, peakDemandText } from '@/shared/panel-checks';
import type { Circuit, Panel } from '@/shared/schemas';

const one = (x: number) => (Math.round(x * 10) / 10).toString();

type Answer = { result: SpareCapacity } | { problem: string } | null;

/**
 * "Can this panel take…?" — a new load (A or VA, poles, volts) against the measured peak demand
 * at 125 % and the lower of the panel's and the feeder's rating (NEC 220.87, shared/calc/capacity.ts),
 * with the positions the new breaker would take.
 */
export function SpareCapacityCalculator({ panel, circuits }: { panel: Panel; circuits: Circuit[] }) {
  const info = SYSTEM_INFO[panel.system];
  const [amount, setAmount] = useState('');
  const [unit, setUnit] = useState<'A' | 'VA'>('A');
  const [poles, setPoles] = useState<1 | 2 | 3>(info.phases === 3 ? 3 : 2);
  const [volts, setVolts] = useState(String(info.lineV));
  const [continuous, setContinuous] = useState(false);
  const [answer, setAnswer] = useState<Answer>(null);
  const peakA = peakDemandA(panel);
  const peak = peakDemandText(panel);

  const ask = () => {
    const value = numberOrNull(amount);
    const v = numberOrNull(volts);
    if (value === null || !(value > 0)) return setAnswer({ problem: 'Enter the new load as a number more than 0.' });
    if (v === null || !(v > 0)) return setAnswer({ problem: 'Enter the voltage as a number more than 0.' });
    if (peakA === null || !panel.peakDemandBasis) {
      return setAnswer({ problem: 'Record the measured peak demand (12 months, or 30 days recorded) under Edit panel first: NEC 220.87 starts from it.' });
    }
    const va = unit === 'VA' ? value : poles === 3 ? value * Math.sqrt(3) * v : value * v;
    try {
      const result = spareCapacity({
        system: panel.system,
        spaces: panel.spaces,
        circuits,
        panelRatingA: panel.mainRatingA ? Math.min(panel.mainRatingA, panel.busRatingA) : panel.busRatingA,
        feederRatingA: panel.feederRatingA ?? null,
        peakDemandA: peakA,
        basis: panel.peakDemandBasis,
        newLoad: { va, volts: v, poles, continuous },
      });
      setAnswer({ result });
    } catch (error) {
      if (error instanceof RangeError) return setAnswer({ problem: error.message });
      throw error;
    }
  };

  return (
    <Card testID="spare-capacity">
      <Text variant="label" heading={2}>Can this panel take…?</Text>
      <Text variant="small" tone="soft">
        {peak ? `Measured peak: ${peak}.` : 'No measured peak demand recorded.'}
        {panel.feederRatingA ? ` Feeder ${panel.feederRatingA} A.` : ''}
      </Text>
      <FieldRow wrap>
        <TextField label={`New load (${unit})`} value={amount} onChangeText={setAmount} keyboardType="decimal-pad" mono testID="spare-amount" />
        <TextField label="Volts" value={volts} onChangeText={setVolts} keyboardType="number-pad" mono testID="spare-volts" />
      </FieldRow>
      <ChoiceField label="Given in" choices={[{ value: 'A' as const, label: 'amperes' }, { value: 'VA' as const, label: 'VA' }]} value={unit} onChange={setUnit} />
      <ChoiceField
        label="Poles"
        choices={([1, 2, 3] as const).filter((p) => info.phases === 3 || p < 3).map((p) => ({ value: p, label: `${p}P` }))}
        value={poles}
        onChange={(p) => {
          setPoles(p);
          setVolts(String(p === 1 && info.neutralV ? info.neutralV : info.lineV));
        }}
      />
      <ToggleField label="Continuous (3 h or more): counts at 125 %" value={continuous} onChange={setContinuous} />
      <Button label="Check" tone="secondary" onPress={ask} testID="spare-ask" />
      {answer && 'problem' in answer && <Text variant="small" tone="warn" testID="spare-answer">{answer.problem}</Text>}
      {answer && 'result' in answer && <SpareAnswer result={answer.result} />}
    </Card>
  );
}

function SpareAnswer({ result }: { result: SpareCapacity }) {
  const yes = result.fits && result.positions !== null;
  return (
    <View style={[styles.answer, yes ? styles.yes : styles.no]} testID="spare-answer">
      <Text variant="strong">
        {yes ? 'Yes' : 'No'} — {one(result.totalA)} A against the {result.limitedBy}’s {result.limitA} A
        ({result.headroomA >= 0 ? `${one(result.headroomA)} A to spare` : `${one(-result.headroomA)} A over`})
      </Text>
      <Text variant="small">
        {result.positions ? `It would take position${result.positions.length > 1 ? 's' : ''} ${result.positions.join(', ')}.` : 'No free run of positions for it.'}
      </Text>
      <Text variant="small" tone="soft">{result.rule}</Text>
      <Text variant="small" tone="faint">
        NEC 220.87 also asks that the feeder has overcurrent protection and that no other source hid the demand: confirm
        these before relying on it.
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  answer: { padding: space.sm, borderRadius: radii.sm, gap: space.xs },
  yes: { backgroundColor: colours.paper },
  no: { backgroundColor: colours.dangerSoft },
});
