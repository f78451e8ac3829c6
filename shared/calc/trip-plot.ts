/**
 * The geometry of a time-current band plot: current in multiples of the rating against seconds,
 * both on logarithmic axes, as makers print their curves [CP]. Pure numbers (0–1 of the plot's
 * width and height), so the screen (SVG) and the report (PDF) draw the same picture.
 *
 * The thermal (inverse-time) band is one closed shape between its points; the instantaneous band, when
 * the band has a pickup, is a separate rectangle from the pickup's lower to upper tolerance and from
 * the instantaneous clearing time down — never a line from one region into the other.
 */
import { bandProblem, INSTANTANEOUS_MAX_CLEARING_S, type InstantaneousSetting, type TripBandPoint } from './trip';
import { positive } from './guard';

export interface PlotPoint {
  /** 0 (left) – 1 (right) */
  x: number;
  /** 0 (top) – 1 (bottom) */
  y: number;
}

export interface PlotTick {
  value: number;
  label: string;
  /** position along its axis, 0–1 */
  at: number;
}

export interface TestMark extends PlotPoint {
  multiple: number;
  /** trip time, s; null when it did not trip (drawn at the right edge of time: the top) */
  seconds: number | null;
  label: string;
}

export interface BandPlot {
  /** the thermal band as a closed outline (upper edge left to right, then lower edge back) */
  thermal: PlotPoint[];
  /** the instantaneous band as a closed rectangle, or null without a pickup */
  instantaneous: PlotPoint[] | null;
  tests: TestMark[];
  xTicks: PlotTick[];
  yTicks: PlotTick[];
  /** the axes' ranges, decades */
  multiples: [number, number];
  seconds: [number, number];
}

export interface BandPlotInput {
  points: readonly TripBandPoint[];
  instantaneous?: InstantaneousSetting | null;
  tests?: readonly { multiple: number; seconds: number | null; label: string }[];
}

const decadeBelow = (v: number) => 10 ** Math.floor(Math.log10(v));
const decadeAbove = (v: number) => 10 ** Math.ceil(Math.log10(v));

function label(v: number): string {
  if (v >= 1) return String(Math.round(v));
  return String(Number(v.toPrecision(1)));
}

/**
 * The plot of a band with its test points.
 * @throws RangeError on a band with no points or one {@link bandProblem} refuses, or a test at a multiple or time that is
 * not a finite number > 0.
 */
export function bandPlot({ points, instantaneous = null, tests = [] }: BandPlotInput): BandPlot {
  if (points.length === 0) throw new RangeError('a band plot needs at least one band point');
  const problem = bandProblem(points);
  if (problem !== null) throw new RangeError(problem);
  for (const t of tests) {
    positive('test multiple', t.multiple);
    if (t.seconds !== null) positive('test seconds', t.seconds);
  }
  const sorted = [...points].sort((a, b) => a.multiple - b.multiple);
  const tol = instantaneous ? (instantaneous.tolerancePct ?? 25) / 100 : 0;
  const instLow = instantaneous ? instantaneous.multiple * (1 - tol) : null;
  const instHigh = instantaneous ? instantaneous.multiple * (1 + tol) : null;
  const instFloorS = INSTANTANEOUS_MAX_CLEARING_S / 10;

  const xs = [...sorted.map((p) => p.multiple), ...tests.map((t) => t.multiple), ...(instHigh ? [instHigh * 1.5] : [])];
  const ys = [
    ...sorted.flatMap((p) => [p.minS, p.maxS]),
    ...tests.flatMap((t) => (t.seconds === null ? [] : [t.seconds])),
    ...(instantaneous ? [instFloorS] : []),
  ];
  const multiples: [number, number] = [decadeBelow(Math.min(...xs)), decadeAbove(Math.max(...xs) * 1.0001)];
  const seconds: [number, number] = [decadeBelow(Math.min(...ys)), decadeAbove(Math.max(...ys) * 1.0001)];
  const lx = [Math.log10(multiples[0]), Math.log10(multiples[1])];
  const ly = [Math.log10(seconds[0]), Math.log10(seconds[1])];
  const x = (m: number) => (Math.log10(m) - lx[0]) / (lx[1] - lx[0]);
  // seconds grow upward: the top of the plot is the longest time
  const y = (s: number) => 1 - (Math.log10(s) - ly[0]) / (ly[1] - ly[0]);

  const thermal = [
    ...sorted.map((p) => ({ x: x(p.multiple), y: y(p.maxS) })),
    ...[...sorted].reverse().map((p) => ({ x: x(p.multiple), y: y(p.minS) })),
  ];
  const inst =
    instLow !== null && instHigh !== null
      ? [
          { x: x(instLow), y: y(INSTANTANEOUS_MAX_CLEARING_S) },
          { x: x(instHigh), y: y(INSTANTANEOUS_MAX_CLEARING_S) },
          { x: x(instHigh), y: y(instFloorS) },
          { x: x(instLow), y: y(instFloorS) },
        ]
      : null;
  const ticks = (range: [number, number], at: (v: number) => number): PlotTick[] => {
    const out: PlotTick[] = [];
    for (let v = range[0]; v <= range[1] * 1.0001; v *= 10) out.push({ value: v, label: label(v), at: at(v) });
    return out;
  };
  return {
    thermal,
    instantaneous: inst,
    tests: tests.map((t) => ({
      multiple: t.multiple,
      seconds: t.seconds,
      label: t.label,
      x: x(t.multiple),
      y: t.seconds === null ? 0 : y(t.seconds),
    })),
    xTicks: ticks(multiples, x),
    yTicks: ticks(seconds, (s) => y(s)),
    multiples,
    seconds,
  };
}
