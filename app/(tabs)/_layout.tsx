import { BottomTabBar, Tabs } from 'expo-router/js-tabs';
import { View, type ColorValue } from 'react-native';
import { useHeaderOptions } from '@/components/ui/header-options';
import { Text } from '@/components/ui/text';
import { colours, fonts } from '@/components/ui/theme';
import { useTheme } from '@/components/ui/theme-provider';

const icon = (glyph: string) =>
  function TabIcon({ color }: { color: ColorValue }) {
    // the label says it: the glyph is hidden from screen readers (it was read twice)
    return (
      <Text style={{ color, fontSize: 20 }} accessibilityElementsHidden aria-hidden>
        {glyph}
      </Text>
    );
  };

export default function TabsLayout() {
  const header = useHeaderOptions(true);
  const { palette } = useTheme();
  return (
    <Tabs
      // the sections as a navigation landmark for a screen reader
      tabBar={(props) => (
        <View role="navigation" aria-label="Sections">
          <BottomTabBar {...props} />
        </View>
      )}
      screenOptions={{
        ...header,
        // plain values: the tab bar mixes these itself
        tabBarActiveTintColor: palette.copper,
        tabBarInactiveTintColor: palette.inkSoft,
        tabBarLabelStyle: { fontFamily: fonts.textBold, fontSize: 12 },
        tabBarStyle: { backgroundColor: colours.card, borderTopColor: colours.rule, minHeight: 56 },
        sceneStyle: { backgroundColor: colours.paper },
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
