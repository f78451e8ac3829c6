/** The one theme module: colours, spacing, radii, type scale, font families. */
export const colours = {
  ink: '#1D2733',
  inkSoft: '#4A5563',
  inkFaint: '#7B8593',
  paper: '#F7F5F0',
  card: '#FFFFFF',
  rule: '#DAD5CB',
  ruleStrong: '#B9B2A5',
  copper: '#B35C2E',
  copperSoft: '#F3E3D8',
  danger: '#B8322A',
  dangerSoft: '#F7E0DE',
  warn: '#C77B1A',
  warnSoft: '#FBEBD3',
  ok: '#5E7D46',
  p1: '#B8322A',
  p2: '#C77B1A',
  p3: '#2F6F95',
  p4: '#5E7D46',
  /** the bus phases carry their letter everywhere; the tint only helps the eye follow a row */
  phaseA: '#EDE7DC',
  phaseB: '#E2E8EC',
  phaseC: '#E8E4EE',
} as const;

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
