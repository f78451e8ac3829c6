import { Text as RNText, StyleSheet, type TextProps } from 'react-native';
import { colours, type as typeScale, type TextVariant } from './theme';

export interface ThemedTextProps extends TextProps {
  variant?: TextVariant;
  /** `paper`: on a strong ground (button, selected chip); `bar`: on the header bar */
  tone?: 'ink' | 'soft' | 'faint' | 'copper' | 'danger' | 'warn' | 'paper' | 'bar';
  /**
   * Makes the text a heading of this level for a screen reader, which walks a screen by them. One
   * level 1 per page (the header bar's title, or the screen's own title where there is no bar),
   * card and section titles 2, group heads inside a section 3. On the web it renders <h1>–<h3>.
   */
  heading?: HeadingLevel;
  /** small capitals for a section title, by style: capitals typed into the words are spelt out by some readers */
  caps?: boolean;
}

export type HeadingLevel = 1 | 2 | 3;

/**
 * React Native Web turns role "heading" plus `aria-level` into <hN>; `accessibilityRole="header"`
 * alone always gives <h1>. React Native's types do not list `aria-level`, so it goes in a spread.
 */
export function headingProps(level: HeadingLevel | undefined): Pick<TextProps, 'role'> | undefined {
  if (level === undefined) return undefined;
  const props: Pick<TextProps, 'role'> & { 'aria-level': HeadingLevel } = { role: 'heading', 'aria-level': level };
  return props;
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

export function Text({ variant = 'body', tone = 'ink', heading, caps, style, ...rest }: ThemedTextProps) {
  return (
    <RNText style={[styles.base, typeScale[variant], { color: toneColour[tone] }, caps && styles.caps, style]} {...headingProps(heading)} {...rest} />
  );
}

const styles = StyleSheet.create({ base: { color: colours.ink }, caps: { textTransform: 'uppercase' } });
