/**
 * The card: white on paper, a hairline rule, rounded corners. Every boxed section, list row and
 * tappable row of the app uses it, so the look is set here once. Extra layout (gap, direction,
 * a coloured left edge) comes in `style`, which is laid over the card's.
 */
import { Pressable, StyleSheet, View, type PressableProps, type StyleProp, type ViewProps, type ViewStyle } from 'react-native';
import { colours, radii, space } from './theme';

/**
 * section: a screen's boxed block; row: a list row; compact: a dense row (previews, due lists).
 */
export type CardSize = 'section' | 'row' | 'compact';

const look = { backgroundColor: colours.card, borderWidth: 1, borderColor: colours.rule } as const;

export const cardStyles = StyleSheet.create({
  section: { ...look, borderRadius: radii.lg, padding: space.lg },
  row: { ...look, borderRadius: radii.md, padding: space.md },
  compact: { ...look, borderRadius: radii.md, padding: space.sm },
  /** a box that holds figures being entered or judged: a firmer rule */
  strong: { borderColor: colours.ruleStrong },
  pressed: { opacity: 0.7 },
  /** a card's content stacks with a small gap unless its style says otherwise */
  stack: { gap: space.sm },
});

export interface CardProps extends ViewProps {
  size?: CardSize;
  strong?: boolean;
}

export function Card({ size = 'section', strong, style, ...rest }: CardProps) {
  return <View style={[cardStyles[size], cardStyles.stack, strong && cardStyles.strong, style]} {...rest} />;
}

export interface PressableCardProps extends Omit<PressableProps, 'style'> {
  size?: CardSize;
  style?: StyleProp<ViewStyle>;
}

/** A card that opens something: dims while pressed. */
export function PressableCard({ size = 'row', style, ...rest }: PressableCardProps) {
  return <Pressable style={({ pressed }) => [cardStyles[size], style, pressed && cardStyles.pressed]} {...rest} />;
}
