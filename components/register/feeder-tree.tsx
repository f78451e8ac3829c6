import { StyleSheet, View } from 'react-native';
import { PressableCard } from '@/components/ui/card';
import { SYSTEM_INFO } from '@/shared/domain';
import type { Panel } from '@/shared/schemas';
import { Text } from '@/components/ui/text';
import { colours, MIN_TOUCH, radii, space } from '@/components/ui/theme';

interface Node {
  panel: Panel;
  children: Node[];
}

/** Panels that are fed from nothing recorded (or from a panel not listed) are the roots. */
export function feederTree(panels: Panel[]): Node[] {
  const ids = new Set(panels.map((p) => p.id));
  const childrenOf = new Map<string | null, Panel[]>();
  for (const panel of panels) {
    const parent = panel.fedFromPanelId && ids.has(panel.fedFromPanelId) ? panel.fedFromPanelId : null;
    childrenOf.set(parent, [...(childrenOf.get(parent) ?? []), panel]);
  }
  const build = (parent: string | null, seen: Set<string>): Node[] =>
    (childrenOf.get(parent) ?? [])
      .filter((p) => !seen.has(p.id))
      .map((panel) => ({ panel, children: build(panel.id, new Set([...seen, panel.id])) }));
  return build(null, new Set());
}

/** The building's panels as the power flows: which panel feeds which. */
export function FeederTree({ panels, onOpen }: { panels: Panel[]; onOpen: (panel: Panel) => void }) {
  const byId = new Map(panels.map((p) => [p.id, p]));
  const renderNode = (node: Node, depth: number): React.ReactNode => (
    <View key={node.panel.id}>
      <PressableCard
        accessibilityRole="button"
        // named by what it shows (tag, location, system), so the words heard are the words seen
        testID={`panel-${node.panel.tag}`}
        onPress={() => onOpen(node.panel)}
        style={[styles.node, { marginLeft: depth * space.xl }]}
      >
        {depth > 0 && <Text style={styles.elbow} tone="faint">└</Text>}
        <View style={styles.tag}>
          <Text variant="readingBold" tone="paper">{node.panel.tag}</Text>
        </View>
        <View style={styles.details}>
          <Text variant="strong">{node.panel.location || 'Location not recorded'}</Text>
          <Text variant="small" tone="soft">
            {SYSTEM_INFO[node.panel.system].label} · {node.panel.busRatingA} A bus ·{' '}
            {node.panel.mainRatingA ? `${node.panel.mainRatingA} A main` : 'main lugs only'}
          </Text>
          {node.panel.fedFromPanelId && (
            <Text variant="small" tone="faint">
              fed from {byId.get(node.panel.fedFromPanelId)?.tag ?? 'another panel'}
              {node.panel.fedFromPosition ? `, position ${node.panel.fedFromPosition}` : ''}
            </Text>
          )}
        </View>
        <Text tone="faint">›</Text>
      </PressableCard>
      {node.children.map((child) => renderNode(child, depth + 1))}
    </View>
  );
  return <View style={styles.tree}>{feederTree(panels).map((n) => renderNode(n, 0))}</View>;
}

const styles = StyleSheet.create({
  tree: { gap: space.sm },
  node: {
    minHeight: MIN_TOUCH + 16,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    marginBottom: space.sm,
  },
  elbow: { marginRight: -space.xs },
  tag: { backgroundColor: colours.ink, borderRadius: radii.sm, paddingHorizontal: space.sm, paddingVertical: 2 },
  details: { flex: 1, gap: 2 },
});
