/**
 * What the time-current band plot says beside its geometry (shared/calc/trip-plot.ts), for the
 * screen's SVG and the report's PDF alike: the shape of each test mark (a verdict is a shape AND a
 * word, never a colour alone), its short word, and a caption that lists every point in text for
 * anyone who cannot read the picture.
 */
import { bandPlot, type BandPlot, type TripTestResult, type TripVerdict } from './calc';
import type { Band } from './records';

/** A filled circle passes; a cross is any failure; an open square was not judged. */
export type MarkShape = 'circle' | 'cross' | 'square';

export function markShape(verdict: TripVerdict | null): MarkShape {
  if (verdict === null) return 'square';
  return verdict === 'pass' ? 'circle' : 'cross';
}

/** The word printed beside a mark. */
export const MARK_WORDS: Record<TripVerdict, string> = {
  pass: 'PASS',
  slow: 'SLOW',
  fast: 'FAST',
  'no-trip': 'NO TRIP',
  'unexpected-trip': 'UNEXPECTED TRIP',
};
export function markWord(verdict: TripVerdict | null): string {
  return verdict === null ? 'NOT JUDGED' : MARK_WORDS[verdict];
}

/** One trip test to put on the plot. */
export interface PlotTest {
  testA: number;
  /** null: it did not trip */
  tripS: number | null;
  verdict: TripVerdict | null;
}

export interface BandPlotView {
  plot: BandPlot;
  /** the words for each test mark, in the order of `plot.tests` */
  verdicts: (TripVerdict | null)[];
  caption: string;
  title: string;
}

type PlotBand = Pick<Band, 'label' | 'ratingA' | 'points' | 'instantaneousMultiple' | 'instantaneousTolerancePct'>;

const num = (x: number) => String(Math.round(x * 100) / 100);

/**
 * The band with its tests, ready to draw: null when the band cannot be drawn (it has no points or
 * its times rise with current — the band's own screen says why).
 */
export function bandPlotView(band: PlotBand, tests: readonly PlotTest[] = []): BandPlotView | null {
  const marks = tests.filter((t) => Number.isFinite(t.testA) && t.testA > 0 && (t.tripS === null || (Number.isFinite(t.tripS) && t.tripS > 0)));
  let plot: BandPlot;
  try {
    plot = bandPlot({
      points: band.points,
      instantaneous:
        band.instantaneousMultiple !== null
          ? { multiple: band.instantaneousMultiple, tolerancePct: band.instantaneousTolerancePct }
          : null,
      tests: marks.map((t) => ({
        multiple: t.testA / band.ratingA,
        seconds: t.tripS,
        label: `${markWord(t.verdict)}: ${num(t.testA)} A (${Math.round((100 * t.testA) / band.ratingA)} %), ${t.tripS === null ? 'did not trip' : `${num(t.tripS)} s`}`,
      })),
    });
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
  const title = `Time-current band ${band.label}, ${band.ratingA} A`;
  const inst =
    band.instantaneousMultiple !== null
      ? ` Instantaneous pickup ${num(band.instantaneousMultiple)}× ±${band.instantaneousTolerancePct ?? 25} %.`
      : ' No instantaneous pickup recorded.';
  const first = band.points[0];
  const last = band.points[band.points.length - 1];
  const thermal = `Thermal band from ${num(first.multiple)}× (${num(first.minS)}–${num(first.maxS)} s) to ${num(last.multiple)}× (${num(last.minS)}–${num(last.maxS)} s).`;
  const points = plot.tests.length
    ? ` Test ${plot.tests.length === 1 ? 'point' : 'points'}: ${plot.tests.map((t) => t.label).join('; ')}.`
    : ' No test points.';
  return {
    plot,
    verdicts: marks.map((t) => t.verdict),
    caption: `${title}: current in multiples of the rating (log) against seconds to trip (log). ${thermal}${inst}${points}`,
    title,
  };
}

/** A trip-test reading as a plot test, from its stored fields and its judgement. */
export function plotTestOf(r: { testCurrentA: number | null; tripped: boolean | null; tripTimeS: number | null }, result: TripTestResult | null): PlotTest | null {
  if (r.testCurrentA === null || r.tripped === null) return null;
  if (r.tripped && r.tripTimeS === null) return null;
  return { testA: r.testCurrentA, tripS: r.tripped ? r.tripTimeS : null, verdict: result?.verdict ?? null };
}
