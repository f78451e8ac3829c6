import { ScrollView, StyleSheet, View, type ViewProps } from 'react-native';
import { StorageProblem } from '@/components/sync/storage-problem';
import { colours, space } from './theme';

/** Page body: paper background, comfortable padding, a readable column on wide screens. */
export function Screen({ children, scroll = true, wide = false, style }: ViewProps & { scroll?: boolean; wide?: boolean }) {
  // the page's main landmark for a screen reader (the header and the tab bar are outside it)
  const inner = (
    <View role="main" style={[styles.column, wide && styles.wideColumn, style]}>
      <StorageProblem />
      {children}
    </View>
  );
  if (!scroll) return <View style={styles.page}>{inner}</View>;
  return (
    <ScrollView style={styles.page} contentContainerStyle={styles.content} keyboardShouldPersistTaps="handled">
      {inner}
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, backgroundColor: colours.paper },
  content: { flexGrow: 1 },
  column: { flex: 1, width: '100%', maxWidth: 760, alignSelf: 'center', padding: space.lg, gap: space.lg },
  wideColumn: { maxWidth: 1400 },
});
