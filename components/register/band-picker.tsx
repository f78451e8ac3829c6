/**
 * A circuit's time-current band, chosen from the organisation's library: its trip tests are then
 * judged against the maker's curve instead of the NETA 300 % fallback.
 */
import { useBands } from '@/hooks/use-records';
import { ChoiceField } from '@/components/ui/fields';

export function BandPicker({
  ratingA,
  value,
  onChange,
  error,
}: {
  ratingA: number;
  value: string | null;
  onChange: (bandId: string | null) => void;
  error?: string;
}) {
  const bands = useBands().data;
  // a band is read for one rating; one of another rating stays listed only while it is the choice
  const fitting = (bands ?? []).filter((b) => b.ratingA === ratingA || b.id === value);
  const chosen = bands?.find((b) => b.id === value);
  const hint =
    bands === undefined
      ? 'The band library is not on this device yet.'
      : chosen && chosen.ratingA !== ratingA
        ? `This band is for a ${chosen.ratingA} A breaker; this one is ${ratingA} A.`
        : fitting.length === 0
          ? `No ${ratingA} A band in the library yet (Me → Band library). Trip tests fall back to the NETA 300 % table.`
          : 'From the maker’s published curve; trip tests on this circuit are judged against it.';
  return (
    <ChoiceField
      label="Time-current band"
      choices={[
        { value: null, label: 'None' },
        ...fitting.map((b) => ({ value: b.id as string | null, label: `${b.label} (${b.ratingA} A)` })),
        // a band chosen earlier but no longer in the library still shows as the choice
        ...(value && !chosen ? [{ value: value as string | null, label: 'A band not on this device' }] : []),
      ]}
      value={value}
      onChange={onChange}
      error={error}
      hint={hint}
    />
  );
}
