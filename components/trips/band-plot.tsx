/**
 * A time-current band as makers draw one: current in multiples of the rating (log, across) against
 * seconds to trip (log, up). The thermal band is shaded, the instantaneous band is its own box, and
 * each trip test is a mark whose verdict is a shape AND a word (a filled circle passes, a cross
 * fails, an open square was not judged), never a colour alone. The caption under the picture says
 * the same in text for a screen reader. Geometry: shared/calc/trip-plot.ts (the report draws the
 * same picture from it); words: shared/band-plot-words.ts.
 */
import { useState } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import Svg, { Circle, G, Line, Path, Rect, Text as SvgText } from 'react-native-svg';
import { bandPlotView, markShape, markWord, type PlotTest } from '@/shared/band-plot-words';
import type { Band } from '@/shared/records';
import { Text } from '@/components/ui/text';
import { colours, fonts, space } from '@/components/ui/theme';

/** Room for the axis numbers and titles, px. */
const PAD = { left: 46, right: 14, top: 12, bottom: 40 };
const MIN_WIDTH = 260;

type PlotBand = Pick<Band, 'label' | 'ratingA' | 'points' | 'instantaneousMultiple' | 'instantaneousTolerancePct'>;

/** Values 2–9 of every decade in [from, to], for the faint grid lines of a log axis. */
function minorValues([from, to]: [number, number]): number[] {
  const out: number[] = [];
  for (let d = from; d < to * 0.9999; d *= 10) for (let k = 2; k <= 9; k += 1) out.push(d * k);
  return out;
}
const logAt = ([from, to]: [number, number], v: number) => (Math.log10(v) - Math.log10(from)) / (Math.log10(to) - Math.log10(from));

export function BandPlot({ band, tests = [], testID = 'band-plot' }: { band: PlotBand; tests?: readonly PlotTest[]; testID?: string }) {
  const [width, setWidth] = useState(0);
  const view = bandPlotView(band, tests);
  if (!view) {
    return (
      <Text variant="small" tone="warn" testID={`${testID}-unavailable`}>
        ⚠ This band cannot be drawn: its times must fall as current rises. Check its points in the band library.
      </Text>
    );
  }
  const { plot, verdicts, caption } = view;
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.max(MIN_WIDTH, Math.round(e.nativeEvent.layout.width)));
  // a log–log plot reads best a little wider than tall; a phone gets about 360 × 290
  const height = Math.round(Math.min(420, Math.max(240, width * 0.8)));
  const w = width - PAD.left - PAD.right;
  const h = height - PAD.top - PAD.bottom;
  const px = (x: number) => PAD.left + x * w;
  const py = (y: number) => PAD.top + y * h;
  const path = (pts: { x: number; y: number }[]) => `${pts.map((p, i) => `${i === 0 ? 'M' : 'L'}${px(p.x).toFixed(1)},${py(p.y).toFixed(1)}`).join(' ')} Z`;

  return (
    <View style={styles.wrap} testID={testID}>
      <View
        onLayout={onLayout}
        accessible
        role="img"
        accessibilityLabel={caption}
        style={styles.picture}
      >
        {width > 0 && (
          <Svg width={width} height={height} viewBox={`0 0 ${width} ${height}`}>
            <Rect x={PAD.left} y={PAD.top} width={w} height={h} fill={colours.card} stroke={colours.ruleStrong} strokeWidth={1} />
            {minorValues(plot.multiples).map((v) => (
              <Line key={`mx${v}`} x1={px(logAt(plot.multiples, v))} x2={px(logAt(plot.multiples, v))} y1={PAD.top} y2={PAD.top + h} stroke={colours.rule} strokeWidth={0.5} />
            ))}
            {minorValues(plot.seconds).map((v) => (
              <Line key={`my${v}`} x1={PAD.left} x2={PAD.left + w} y1={py(1 - logAt(plot.seconds, v))} y2={py(1 - logAt(plot.seconds, v))} stroke={colours.rule} strokeWidth={0.5} />
            ))}
            {plot.xTicks.map((t) => (
              <G key={`x${t.value}`}>
                <Line x1={px(t.at)} x2={px(t.at)} y1={PAD.top} y2={PAD.top + h} stroke={colours.ruleStrong} strokeWidth={1} />
                <SvgText x={px(t.at)} y={PAD.top + h + 14} fontSize={11} fontFamily={fonts.mono} fill={colours.inkSoft} textAnchor="middle">
                  {`${t.label}×`}
                </SvgText>
              </G>
            ))}
            {plot.yTicks.map((t) => (
              <G key={`y${t.value}`}>
                <Line x1={PAD.left} x2={PAD.left + w} y1={py(t.at)} y2={py(t.at)} stroke={colours.ruleStrong} strokeWidth={1} />
                <SvgText x={PAD.left - 4} y={py(t.at) + 4} fontSize={11} fontFamily={fonts.mono} fill={colours.inkSoft} textAnchor="end">
                  {t.label}
                </SvgText>
              </G>
            ))}
            <Path d={path(plot.thermal)} fill={colours.copperSoft} stroke={colours.copper} strokeWidth={1.5} testID="band-thermal" />
            {plot.instantaneous && (
              <Path d={path(plot.instantaneous)} fill={colours.copperSoft} stroke={colours.copper} strokeWidth={1.5} strokeDasharray="4 3" testID="band-instantaneous" />
            )}
            {plot.tests.map((t, i) => (
              <Mark key={`t${i}`} x={px(t.x)} y={py(t.y)} verdict={verdicts[i] ?? null} right={t.x > 0.6} />
            ))}
            <SvgText x={PAD.left + w / 2} y={height - 6} fontSize={12} fontFamily={fonts.text} fill={colours.ink} textAnchor="middle">
              Current, multiples of rating
            </SvgText>
            <SvgText
              x={12}
              y={PAD.top + h / 2}
              fontSize={12}
              fontFamily={fonts.text}
              fill={colours.ink}
              textAnchor="middle"
              transform={`rotate(-90 12 ${PAD.top + h / 2})`}
            >
              Seconds to trip
            </SvgText>
          </Svg>
        )}
      </View>
      <Text variant="small" tone="soft" testID={`${testID}-caption`}>
        {caption}
      </Text>
      <Text variant="small" tone="faint">
        ● passed · ✕ failed · □ not judged. Shaded: the band between its minimum and maximum times; dashed: the instantaneous pickup band.
      </Text>
    </View>
  );
}

/** One trip test: its shape and its word, placed left of the mark near the right edge. */
function Mark({ x, y, verdict, right }: { x: number; y: number; verdict: Parameters<typeof markShape>[0]; right: boolean }) {
  const shape = markShape(verdict);
  const colour = shape === 'cross' ? colours.danger : colours.ink;
  const word = markWord(verdict);
  return (
    <G testID={`band-test-mark-${shape}`}>
      {shape === 'circle' && <Circle cx={x} cy={y} r={6} fill={colours.ink} stroke={colours.card} strokeWidth={1.5} />}
      {shape === 'cross' && (
        <Path d={`M${x - 6},${y - 6} L${x + 6},${y + 6} M${x - 6},${y + 6} L${x + 6},${y - 6}`} stroke={colour} strokeWidth={3} />
      )}
      {shape === 'square' && <Rect x={x - 5} y={y - 5} width={10} height={10} fill={colours.card} stroke={colour} strokeWidth={2} />}
      <SvgText
        x={right ? x - 10 : x + 10}
        y={y - 8}
        fontSize={11}
        fontFamily={fonts.textBold}
        fill={colour}
        textAnchor={right ? 'end' : 'start'}
      >
        {word}
      </SvgText>
    </G>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.xs },
  picture: { width: '100%' },
});
