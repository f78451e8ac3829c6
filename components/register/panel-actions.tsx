/**
 * The panel screen's actions behind one button, so on a phone the schedule comes first: a
 * disclosure (a button that says whether it is open, and a list of ordinary buttons under it), which
 * a keyboard reaches with Tab and a screen reader announces as expanded or collapsed.
 */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import { CsvButtons } from '@/components/csv/csv-buttons';
import { PrintDirectoryButton } from '@/components/documents/print-button';
import { InspectPanelButton } from '@/components/inspections/inspection-entry';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Text } from '@/components/ui/text';
import { space } from '@/components/ui/theme';
import type { Role } from '@/shared/domain';

const MENU_ID = 'panel-actions-menu';

export function PanelActions({ panelId, buildingId, role, canEdit }: { panelId: string; buildingId: string; role: Role; canEdit: boolean }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  return (
    <View style={styles.wrap}>
      <Button
        label={open ? 'Panel actions ▴' : 'Panel actions ▾'}
        accessibilityLabel="Panel actions"
        tone="secondary"
        aria-expanded={open}
        onPress={() => setOpen((o) => !o)}
        testID="panel-actions"
        style={styles.toggle}
      />
      {open && (
        <Card size="compact" nativeID={MENU_ID} style={styles.menu} testID="panel-actions-menu" aria-label="Panel actions">
          <InspectPanelButton role={role} buildingId={buildingId} panelId={panelId} />
          {canEdit && (
            <Button
              label="Edit panel"
              tone="secondary"
              testID="edit-panel"
              onPress={() => router.push({ pathname: '/panels/[panelId]/edit', params: { panelId } })}
            />
          )}
          {canEdit && (
            <Button
              label="Read a door card"
              tone="secondary"
              testID="door-card-open"
              onPress={() => router.push({ pathname: '/panels/[panelId]/door-card', params: { panelId } })}
            />
          )}
          <Text variant="label">Schedule file</Text>
          <CsvButtons panelId={panelId} canImport={canEdit} />
          <Text variant="label">Printed directory</Text>
          <PrintDirectoryButton panelId={panelId} />
        </Card>
      )}
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.sm },
  toggle: { alignSelf: 'flex-start' },
  menu: { gap: space.sm, alignSelf: 'stretch' },
});
