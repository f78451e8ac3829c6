import { Tabs } from 'expo-router/js-tabs';
import type { ColorValue } from 'react-native';
import { headerOptions } from '@/components/ui/header-options';
import { Text } from '@/components/ui/text';
import { colours, fonts } from '@/components/ui/theme';

const icon = (glyph: string) =>
  function TabIcon({ color }: { color: ColorValue }) {
    return <Text style={{ color, fontSize: 20 }} accessibilityElementsHidden>{glyph}</Text>;
  };

export default function TabsLayout() {
  return (
    <Tabs
      screenOptions={{
        ...headerOptions(true),
        tabBarActiveTintColor: colours.copper,
        tabBarInactiveTintColor: colours.inkSoft,
        tabBarLabelStyle: { fontFamily: fonts.textBold, fontSize: 12 },
        tabBarStyle: { backgroundColor: colours.card, minHeight: 56 },
      }}
    >
      {/* a stack of its own (app/(tabs)/(home)/_layout.tsx) with its own header */}
      <Tabs.Screen name="(home)" options={{ title: 'Buildings', headerShown: false, tabBarIcon: icon('▦') }} />
      <Tabs.Screen name="findings" options={{ title: 'Findings', tabBarIcon: icon('◎') }} />
      <Tabs.Screen name="sync" options={{ title: 'Sync', tabBarIcon: icon('⇅') }} />
      <Tabs.Screen name="me" options={{ title: 'Me', tabBarIcon: icon('●') }} />
    </Tabs>
  );
}
