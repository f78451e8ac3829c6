/** The part of the photo a line was read from, so the review compares the reading with the card. */
import { Image, StyleSheet, View } from 'react-native';
import type { CardPhoto } from '@/hooks/use-door-card';
import type { Box } from '@/shared/door-card/parse';
import { colours, radii } from '../ui/theme';

const PAD = 6;
const MAX_WIDTH = 320;

export function PhotoCrop({ photo, box, label }: { photo: CardPhoto; box: Box; label: string }) {
  const x0 = Math.max(0, box.x0 - PAD);
  const y0 = Math.max(0, box.y0 - PAD);
  const w = Math.min(photo.width, box.x1 + PAD) - x0;
  const h = Math.min(photo.height, box.y1 + PAD) - y0;
  if (w <= 0 || h <= 0) return null;
  const scale = Math.min(1, MAX_WIDTH / w);
  return (
    <View style={[styles.frame, { width: w * scale, height: h * scale }]} accessibilityRole="image" accessibilityLabel={label}>
      <Image
        source={{ uri: photo.uri }}
        style={{ width: photo.width * scale, height: photo.height * scale, marginLeft: -x0 * scale, marginTop: -y0 * scale }}
      />
    </View>
  );
}

const styles = StyleSheet.create({
  frame: { overflow: 'hidden', borderRadius: radii.sm, borderWidth: 1, borderColor: colours.rule, backgroundColor: colours.card },
});
