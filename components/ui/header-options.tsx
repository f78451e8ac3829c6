import { Pressable, StyleSheet, View } from 'react-native';
import { SyncStatus } from '@/components/sync/sync-status';
import { Text } from './text';
import { colours, fonts, MIN_TOUCH, space } from './theme';
import { useTheme } from './theme-provider';

interface BackProps {
  canGoBack?: boolean;
  onPress?: () => void;
  accessibilityLabel?: string;
  href?: string;
}

/**
 * Our back button: a 44×44 target (the stock one measured 30×30) with the arrow as text, so it
 * takes the theme's colour like every other word on the bar.
 */
function BackButton({ canGoBack, onPress, accessibilityLabel }: BackProps) {
  // with no way back (a tab's first screen) the title would sit 4 px from the screen's edge: a
  // spacer lines it up with the content below
  if (!canGoBack) return <View style={styles.noBack} />;
  return (
    <Pressable accessibilityRole="button" accessibilityLabel={accessibilityLabel ?? 'Go back'} onPress={onPress} style={styles.back} testID="header-back">
      <Text variant="title" tone="bar" aria-hidden>
        ←
      </Text>
    </Pressable>
  );
}

/** The header every navigator of the app shows: the dark bar, its text, the sync status on the right. */
export function useHeaderOptions(withSyncStatus: boolean) {
  const { palette } = useTheme();
  return {
    headerStyle: { backgroundColor: colours.bar },
    // a plain value: the navigator tints images with it, where a CSS variable does not reach
    headerTintColor: palette.onBar,
    headerTitleStyle: { fontFamily: fonts.textBold },
    headerLeft: (props: BackProps) => <BackButton {...props} />,
    headerRight: withSyncStatus ? () => <SyncStatus /> : undefined,
  };
}

const styles = StyleSheet.create({
  noBack: { width: space.md },
  back: { minWidth: MIN_TOUCH, minHeight: MIN_TOUCH, alignItems: 'center', justifyContent: 'center', marginLeft: space.xs },
});
