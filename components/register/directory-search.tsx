import { useRouter } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, View } from 'react-native';
import { cardStyles } from '@/components/ui/card';
import { useBuildingDirectory } from '@/hooks/use-register';
import { searchDirectory } from '@/shared/directory-search';
import { STATUS_LABELS } from './circuit-form';
import { TextField } from '@/components/ui/fields';
import { Text } from '@/components/ui/text';
import { MIN_TOUCH, space } from '@/components/ui/theme';

const SHOWN = 12;

/**
 * "Find a breaker" across a building's panels: by place ("2LA-14") or by what it feeds ("walk-in
 * cooler"), on the device's copy, so it works with no signal. Each result opens its circuit.
 */
export function DirectorySearch({ buildingId }: { buildingId: string }) {
  const router = useRouter();
  const [query, setQuery] = useState('');
  const directory = useBuildingDirectory(buildingId).data;
  if (!directory || directory.circuits.length === 0) return null;
  const matches = query.trim() ? searchDirectory(query, directory.panels, directory.circuits) : [];
  return (
    <View style={styles.wrap} testID="directory-search">
      <TextField
        label="Find a breaker"
        value={query}
        onChangeText={setQuery}
        // a short example: a phone cut the longer one off mid-word; what to type is in the hint
        placeholder="“walk-in cooler” or “LA 14”"
        hint="What it feeds, or a panel and position. Searches every panel of this building, also with no signal."
        autoCorrect={false}
        returnKeyType="search"
        testID="directory-query"
      />
      {query.trim() !== '' && matches.length === 0 ? (
        <Text tone="soft" testID="directory-no-match">
          Nothing in this building’s directory matches “{query.trim()}”. Try another word from the description, or a panel tag and position.
        </Text>
      ) : null}
      {matches.slice(0, SHOWN).map(({ circuit, panel }) => (
        <Pressable
          key={circuit.id}
          accessibilityRole="link"
          accessibilityLabel={`Panel ${panel.tag} position ${circuit.position}: ${circuit.description || STATUS_LABELS[circuit.status]}`}
          onPress={() =>
            router.push({ pathname: '/panels/[panelId]/circuits/[circuitId]', params: { panelId: panel.id, circuitId: circuit.id } })
          }
          style={[cardStyles.row, styles.result]}
          testID="directory-result"
        >
          <Text variant="reading" style={styles.place}>
            {panel.tag} · {circuit.position}
            {circuit.poles > 1 ? ` (${circuit.poles}P)` : ''}
          </Text>
          <View style={styles.what}>
            <Text>{circuit.description || STATUS_LABELS[circuit.status]}</Text>
            <Text variant="small" tone="soft">
              {circuit.ratingA ? `${circuit.ratingA} A` : 'no breaker'} · {STATUS_LABELS[circuit.status]}
            </Text>
          </View>
        </Pressable>
      ))}
      {matches.length > SHOWN ? (
        <Text variant="small" tone="soft">
          {matches.length - SHOWN} more: add a word to narrow the search.
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  result: {
    flexDirection: 'row',
    gap: space.md,
    alignItems: 'center',
    minHeight: MIN_TOUCH,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
  },
  place: { minWidth: 80 },
  what: { flex: 1, gap: 2 },
});
