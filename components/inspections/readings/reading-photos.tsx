/** The thermal and visible images of a saved thermal reading (the photo strip does the work). */
import { StyleSheet, View } from 'react-native';
import { PhotoStrip } from '@/components/documents/photos';
import { space } from '@/components/ui/theme';

export function ReadingPhotos({ buildingId, readingId, canAdd }: { buildingId: string; readingId: string; canAdd: boolean }) {
  return (
    <View style={styles.box} testID="reading-photos">
      <PhotoStrip buildingId={buildingId} parentKind="reading" parentId={readingId} purpose="thermal" canAdd={canAdd} label="Thermal image" />
      <PhotoStrip buildingId={buildingId} parentKind="reading" parentId={readingId} purpose="visible" canAdd={canAdd} label="Visible image" />
    </View>
  );
}

const styles = StyleSheet.create({ box: { gap: space.md } });
