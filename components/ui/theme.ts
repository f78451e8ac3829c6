/** The one theme module: colours, spacing, radii, type scale, font families. */
import { Appearance, Platform } from 'react-native';
import { PALETTES, type ColourScheme, type ColourToken } from './palette';
import { readThemePreferenceNow, type ThemePreference } from './theme-preference';

export { PALETTES, type ColourScheme, type ColourToken } from './palette';

const TOKENS = Object.keys(PALETTES.light) as ColourToken[];
const cssName = (token: ColourToken) => `--aw-${token}`;

/** The scheme a preference means under the system's own setting. */
export function resolveScheme(preference: ThemePreference, system: string | null | undefined): ColourScheme {
  if (preference !== 'system') return preference;
  return system === 'dark' ? 'dark' : 'light';
}

/**
 * On the web every colour is a CSS variable, so one switch on <html> recolours every style sheet
 * at once (React Native Web passes `var(…)` colours through as they are) and no screen needs a
 * hook. A native build takes the system's scheme when the app starts.
 */
export const colours: Record<ColourToken, string> =
  Platform.OS === 'web'
    ? (Object.fromEntries(TOKENS.map((t) => [t, `var(${cssName(t)})`])) as Record<ColourToken, string>)
    : PALETTES[resolveScheme(readThemePreferenceNow() ?? 'system', Appearance.getColorScheme())];

/** Sets the page's colours (web). `color-scheme` makes the browser's own controls follow too. */
export function applyScheme(scheme: ColourScheme) {
  if (Platform.OS !== 'web' || typeof document === 'undefined') return;
  const root = document.documentElement;
  for (const token of TOKENS) root.style.setProperty(cssName(token), PALETTES[scheme][token]);
  root.style.setProperty('color-scheme', scheme);
  root.style.setProperty('background-color', PALETTES[scheme].paper);
  root.dataset.theme = scheme;
}

// before the first paint: the stored choice, else the system's (no flash of the other theme)
if (Platform.OS === 'web' && typeof window !== 'undefined' && typeof window.matchMedia === 'function') {
  const system = window.matchMedia('(prefers-color-scheme: dark)').matches ? 'dark' : 'light';
  applyScheme(resolveScheme(readThemePreferenceNow() ?? 'system', system));
}

export const space = { xs: 4, sm: 8, md: 12, lg: 16, xl: 24, xxl: 32 } as const;
export const radii = { sm: 4, md: 8, lg: 12 } as const;

export const fonts = {
  text: 'AtkinsonHyperlegible',
  textBold: 'AtkinsonHyperlegible-Bold',
  mono: 'IBMPlexMono',
  monoBold: 'IBMPlexMono-SemiBold',
} as const;

export const type = {
  title: { fontFamily: fonts.textBold, fontSize: 24, lineHeight: 30 },
  heading: { fontFamily: fonts.textBold, fontSize: 18, lineHeight: 24 },
  body: { fontFamily: fonts.text, fontSize: 16, lineHeight: 22 },
  strong: { fontFamily: fonts.textBold, fontSize: 16, lineHeight: 22 },
  small: { fontFamily: fonts.text, fontSize: 13, lineHeight: 18 },
  label: { fontFamily: fonts.textBold, fontSize: 13, lineHeight: 18, letterSpacing: 0.3 },
  reading: { fontFamily: fonts.mono, fontSize: 15, lineHeight: 20 },
  readingBold: { fontFamily: fonts.monoBold, fontSize: 15, lineHeight: 20 },
} as const;

export type TextVariant = keyof typeof type;

/** Touch targets stay at least this tall (WCAG / platform guidance). */
export const MIN_TOUCH = 44;

/** Two-pane and side-by-side schedule from this window width up. */
export const WIDE_MIN_WIDTH = 1024;
