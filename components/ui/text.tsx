import { Text as RNText, StyleSheet, type TextProps } from 'react-native';
import { colours, type as typeScale, type TextVariant } from './theme';

export interface ThemedTextProps extends TextProps {
  variant?: TextVariant;
  /** `paper`: on a strong ground (button, selected chip); `bar`: on the header bar */
  tone?: 'ink' | 'soft' | 'faint' | 'copper' | 'danger' | 'warn' | 'paper' | 'bar';
}

const toneColour = {
  ink: colours.ink,
  soft: colours.inkSoft,
  faint: colours.inkFaint,
  copper: colours.copper,
  danger: colours.danger,
  warn: colours.warn,
  paper: colours.paper,
  bar: colours.onBar,
} as const;

export function Text({ variant = 'body', tone = 'ink', style, ...rest }: ThemedTextProps) {
  return <RNText style={[styles.base, typeScale[variant], { color: toneColour[tone] }, style]} {...rest} />;
}

const styles = StyleSheet.create({ base: { color: colours.ink } });
