import { ActivityIndicator, Pressable, StyleSheet, type PressableProps } from 'react-native';
import { Text } from './text';
import { colours, MIN_TOUCH, radii, space } from './theme';

export interface ButtonProps extends Omit<PressableProps, 'children'> {
  label: string;
  tone?: 'primary' | 'secondary' | 'danger' | 'quiet';
  busy?: boolean;
}

export function Button({ label, tone = 'primary', busy = false, disabled, style, ...rest }: ButtonProps) {
  const inactive = disabled || busy;
  return (
    <Pressable
      accessibilityRole="button"
      accessibilityLabel={label}
      accessibilityState={{ disabled: !!inactive, busy }}
      disabled={inactive}
      style={(state) => [
        styles.base,
        styles[tone],
        state.pressed && styles.pressed,
        inactive && styles.inactive,
        typeof style === 'function' ? style(state) : style,
      ]}
      {...rest}
    >
      {busy ? (
        <ActivityIndicator color={tone === 'primary' || tone === 'danger' ? colours.paper : colours.ink} />
      ) : (
        <Text variant="strong" tone={tone === 'primary' || tone === 'danger' ? 'paper' : 'ink'}>
          {label}
        </Text>
      )}
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: {
    minHeight: MIN_TOUCH,
    paddingHorizontal: space.lg,
    borderRadius: radii.md,
    alignItems: 'center',
    justifyContent: 'center',
    borderWidth: 1,
  },
  primary: { backgroundColor: colours.copper, borderColor: colours.copper },
  secondary: { backgroundColor: colours.card, borderColor: colours.ruleStrong },
  danger: { backgroundColor: colours.danger, borderColor: colours.danger },
  quiet: { backgroundColor: 'transparent', borderColor: 'transparent' },
  pressed: { opacity: 0.8 },
  inactive: { opacity: 0.5 },
});
