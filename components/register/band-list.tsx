/** The organisation's time-current bands: label, rating, how many points, where they came from, and the band drawn on request. */
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { BandPlot } from '@/components/trips/band-plot';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import type { Band } from '@/shared/records';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

export function BandList({ bands }: { bands: Band[] }) {
  return (
    <View style={styles.list} testID="band-list">
      {bands.map((band) => (
        <BandRow key={band.id} band={band} />
      ))}
    </View>
  );
}

function BandRow({ band }: { band: Band }) {
  const [open, setOpen] = useState(false);
  return (
    <Card size="row" testID="band-row">
      <View style={styles.row} accessible accessibilityLabel={`${band.label}, ${band.ratingA} amperes, ${band.points.length} points`}>
        <View style={styles.rating}>
          <Text variant="readingBold" tone="paper">{band.ratingA} A</Text>
        </View>
        <View style={styles.text}>
          <Text variant="strong" heading={3}>{band.label}</Text>
          <Text variant="small" tone="soft">
            <Text variant="reading">{band.points.length}</Text> points · {band.points[0]?.multiple}× to {band.points[band.points.length - 1]?.multiple}×
            {band.instantaneousMultiple ? ` · instantaneous ${band.instantaneousMultiple}×${band.instantaneousTolerancePct !== null ? ` ±${band.instantaneousTolerancePct} %` : ''}` : ''}
          </Text>
          <Text variant="small" tone="faint">{band.source || 'Source not recorded'}</Text>
        </View>
      </View>
      <Button
        label={open ? 'Hide the plot' : 'Show the plot'}
        tone="quiet"
        onPress={() => setOpen(!open)}
        testID="band-show-plot"
      />
      {open && <BandPlot band={band} />}
    </Card>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: {
    minHeight: MIN_TOUCH,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
  },
  rating: { backgroundColor: colours.ink, borderRadius: radii.sm, paddingHorizontal: space.sm, paddingVertical: 2, minWidth: 64, alignItems: 'center' },
  text: { flex: 1, gap: 2 },
});
