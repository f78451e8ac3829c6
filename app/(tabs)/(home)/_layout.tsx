import { Stack } from 'expo-router';
import { useHeaderOptions } from '@/components/ui/header-options';
import { colours } from '@/components/ui/theme';

/**
 * The Buildings tab is a stack: a building, its panels, circuits, inspections and trips open on top
 * of the list, with the tab bar still below on a phone. (Deficiencies, bands and users open above
 * the tabs, from the root stack: they are reached from Findings and Me as well, and going back
 * must return there.) A screen opened straight from a URL
 * (the QR code on a printed door directory) or after a reload gets the list beneath it, so it
 * always has a way back.
 */
export const unstable_settings = { initialRouteName: 'index' };

export default function BuildingsStack() {
  const header = useHeaderOptions(true);
  return (
    <Stack
      screenOptions={{ ...header, contentStyle: { backgroundColor: colours.paper } }}
    >
      <Stack.Screen name="index" options={{ title: 'Buildings' }} />
      <Stack.Screen name="buildings/[buildingId]" options={{ title: 'Building' }} />
      <Stack.Screen name="panels/[panelId]/index" options={{ title: 'Panel schedule' }} />
      <Stack.Screen name="panels/[panelId]/edit" options={{ title: 'Edit panel' }} />
      <Stack.Screen name="panels/[panelId]/new-circuit" options={{ title: 'Add circuit' }} />
      <Stack.Screen name="panels/[panelId]/import" options={{ title: 'Import a schedule' }} />
      <Stack.Screen name="panels/[panelId]/circuits/[circuitId]" options={{ title: 'Circuit' }} />
      <Stack.Screen name="inspections/new" options={{ title: 'New inspection' }} />
      <Stack.Screen name="inspections/[inspectionId]/index" options={{ title: 'Inspection' }} />
      <Stack.Screen name="inspections/[inspectionId]/reading" options={{ title: 'Reading' }} />
      <Stack.Screen name="trips/new" options={{ title: 'Record a trip' }} />
    </Stack>
  );
}
