/**
 * A trip-test reading on its band's plot: the band the reading is judged against (the reading's,
 * else the circuit's) with the reading's one test point. Nothing without a band: the summary then
 * already says what the test was judged against.
 */
import type { Assessment } from '@/shared/assess';
import { plotTestOf } from '@/shared/band-plot-words';
import type { Band, ReadingFields } from '@/shared/records';
import type { Circuit } from '@/shared/schemas';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { BandPlot } from './band-plot';

type TripReading = Pick<ReadingFields, 'kind' | 'testCurrentA' | 'tripped' | 'tripTimeS' | 'bandId' | 'circuitId'>;

/** The band a trip test is judged against: the reading's own, else its circuit's (as assessReading is given). */
export function bandOfReading(reading: TripReading, circuits: readonly Pick<Circuit, 'id' | 'bandId'>[], bands: readonly Band[] | undefined): Band | null {
  const bandId = reading.bandId ?? circuits.find((c) => c.id === reading.circuitId)?.bandId ?? null;
  return (bandId && bands?.find((b) => b.id === bandId)) || null;
}

export function TripReadingPlot({
  reading,
  assessment,
  circuits,
  bands,
}: {
  reading: TripReading;
  assessment: Assessment | null;
  circuits: readonly Pick<Circuit, 'id' | 'bandId'>[];
  bands: readonly Band[] | undefined;
}) {
  const band = reading.kind === 'trip' ? bandOfReading(reading, circuits, bands) : null;
  if (!band) return null;
  const test = plotTestOf(reading, assessment?.kind === 'trip' ? assessment.result : null);
  return (
    <Card size="row" testID="trip-reading-plot">
      <Text variant="label" tone="soft">ON THE BAND · {band.label.toUpperCase()}</Text>
      <BandPlot band={band} tests={test ? [test] : []} />
    </Card>
  );
}
