/**
 * The rise (ΔT) of each of a circuit's terminations across thermal surveys, on its record: a small
 * chart per termination (survey dates across, rise up, in the user's temperature unit) and, in
 * words, whether the latest result deviates from the earlier ones (NFPA 70B condition 2, through
 * riseTrend in shared/calc/thermography.ts). One survey draws nothing: a trend needs two.
 */
import { useState } from 'react';
import { StyleSheet, View, type LayoutChangeEvent } from 'react-native';
import Svg, { Circle, Line, Path, Text as SvgText } from 'react-native-svg';
import type { AssessedReading } from '@/hooks/use-records';
import type { BuildingView } from '@/hooks/building-view';
import { useTemperatureUnit } from '@/hooks/use-temperature-unit';
import { terminationTrends, type TerminationTrend } from '@/shared/thermal-trend';
import { formatTemp, fromCelsius, unitSymbol, type TemperatureUnit } from '@/shared/units';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { colours, fonts, space } from '@/components/ui/theme';

const PAD = { left: 40, right: 16, top: 18, bottom: 26 };
const HEIGHT = 150;

/** The trends of a circuit's terminations, from its record's readings (dates from their inspections). */
export function CircuitThermalTrends({ readings, view }: { readings: readonly AssessedReading[]; view: BuildingView }) {
  const { unit } = useTemperatureUnit();
  const trends = terminationTrends(
    readings.map(({ reading, assessment }) => ({ reading, assessment, takenOn: view.inspection(reading.inspectionId)?.performedOn ?? null })),
  );
  return <ThermalTrends trends={trends} unit={unit} />;
}

export function ThermalTrends({ trends, unit }: { trends: readonly TerminationTrend[]; unit: TemperatureUnit }) {
  if (trends.length === 0) return null;
  return (
    <View style={styles.list} testID="thermal-trends">
      {trends.map((t) => (
        <TrendCard key={t.key} trend={t} unit={unit} />
      ))}
    </View>
  );
}

function TrendCard({ trend: { label, trend }, unit }: { trend: TerminationTrend; unit: TemperatureUnit }) {
  const points = trend.points;
  const latest = points[points.length - 1];
  return (
    <Card size="compact" testID="thermal-trend">
      <Text variant="strong">Rise across surveys · {label}</Text>
      <Text variant="small" tone="faint">The rise each survey was judged on: raised to the reference load where the load was light.</Text>
      {points.length < 2 ? (
        <Text variant="small" tone="soft" testID="thermal-trend-one">
          One survey so far ({latest.takenOn}, ΔT {formatTemp(latest.riseC, unit, 'rise')}): the trend starts with the next.
        </Text>
      ) : (
        <>
          <TrendChart points={points} unit={unit} label={label} />
          <Text variant="small" tone={trend.deviates ? 'warn' : 'soft'} testID="thermal-trend-verdict">
            {trend.deviates
              ? `⚠ Deviates from earlier surveys: NFPA 70B condition 2. ${trendWords(trend.points, unit)}`
              : `In line with earlier surveys. ${trendWords(trend.points, unit)}`}
          </Text>
        </>
      )}
    </Card>
  );
}

/** "2025-11-03 ΔT 6 °C → 2026-11-12 ΔT 22 °C": every point, in the user's unit. */
function trendWords(points: TerminationTrend['trend']['points'], unit: TemperatureUnit): string {
  return points.map((p) => `${p.takenOn} ΔT ${formatTemp(p.riseC, unit, 'rise')}`).join(' → ');
}

function TrendChart({ points, unit, label }: { points: TerminationTrend['trend']['points']; unit: TemperatureUnit; label: string }) {
  const [width, setWidth] = useState(0);
  const onLayout = (e: LayoutChangeEvent) => setWidth(Math.round(e.nativeEvent.layout.width));
  const days = points.map((p) => Date.parse(`${p.takenOn}T00:00:00Z`));
  const rises = points.map((p) => fromCelsius(p.riseC, unit, 'rise'));
  const top = Math.max(1, ...rises) * 1.15;
  const bottom = Math.min(0, ...rises);
  const w = width - PAD.left - PAD.right;
  const h = HEIGHT - PAD.top - PAD.bottom;
  const span = Math.max(1, days[days.length - 1] - days[0]);
  const x = (d: number) => PAD.left + ((d - days[0]) / span) * w;
  const y = (v: number) => PAD.top + (1 - (v - bottom) / (top - bottom)) * h;
  const line = points.map((_, i) => `${i === 0 ? 'M' : 'L'}${x(days[i]).toFixed(1)},${y(rises[i]).toFixed(1)}`).join(' ');
  const described = `${label}: rise by survey, ${points.map((p) => `${p.takenOn} ${formatTemp(p.riseC, unit, 'rise')}`).join(', ')}`;
  return (
    <View onLayout={onLayout} accessible role="img" accessibilityLabel={described} style={styles.chart}>
      {width > 0 && (
        <Svg width={width} height={HEIGHT}>
          <Line x1={PAD.left} x2={PAD.left + w} y1={y(bottom)} y2={y(bottom)} stroke={colours.ruleStrong} strokeWidth={1} />
          <Line x1={PAD.left} x2={PAD.left} y1={PAD.top} y2={PAD.top + h} stroke={colours.ruleStrong} strokeWidth={1} />
          <SvgText x={PAD.left - 4} y={y(bottom) + 4} fontSize={10} fontFamily={fonts.mono} fill={colours.inkSoft} textAnchor="end">
            {String(Math.round(bottom))}
          </SvgText>
          <SvgText x={PAD.left - 4} y={PAD.top + 4} fontSize={10} fontFamily={fonts.mono} fill={colours.inkSoft} textAnchor="end">
            {String(Math.round(top))}
          </SvgText>
          <SvgText x={4} y={PAD.top - 6} fontSize={10} fontFamily={fonts.text} fill={colours.inkSoft}>
            {`ΔT ${unitSymbol(unit)}`}
          </SvgText>
          <Path d={line} stroke={colours.copper} strokeWidth={2} fill="none" />
          {points.map((p, i) => (
            <Circle key={p.takenOn} cx={x(days[i])} cy={y(rises[i])} r={4} fill={colours.copper} />
          ))}
          {points.map((p, i) => (
            <SvgText
              key={`l${p.takenOn}`}
              x={x(days[i])}
              y={HEIGHT - 8}
              fontSize={10}
              fontFamily={fonts.mono}
              fill={colours.inkSoft}
              textAnchor={i === 0 ? 'start' : i === points.length - 1 ? 'end' : 'middle'}
            >
              {p.takenOn}
            </SvgText>
          ))}
          {points.map((p, i) => (
            <SvgText
              key={`v${p.takenOn}`}
              x={x(days[i]) + (i === points.length - 1 ? -6 : 6)}
              y={y(rises[i]) - 8}
              fontSize={10}
              fontFamily={fonts.mono}
              fill={colours.ink}
              textAnchor={i === points.length - 1 ? 'end' : 'start'}
            >
              {formatTemp(p.riseC, unit, 'rise')}
            </SvgText>
          ))}
        </Svg>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  chart: { width: '100%', height: HEIGHT },
});
