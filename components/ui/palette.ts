/**
 * The two palettes of the app, as plain values (no React Native here, so the contrast test reads
 * them in Node). `components/ui/theme.ts` turns them into the `colours` every style uses.
 *
 * Light: ink on paper with a copper accent, our own. Dark: a high-contrast theme for dim electrical
 * rooms — near-black ground, warm off-white text, the accent and warnings lightened so that text
 * in them, and dark text on them, clear WCAG AA (4.5:1) with room to spare (most pairs ≥ 7:1).
 * "paper" is the colour of text ON a strong ground (a primary button, a selected chip), so it is
 * dark in the dark theme; the header bar has its own pair (`bar`/`onBar`) so it stays dark there.
 */
export type ColourScheme = 'light' | 'dark';

const light = {
  ink: '#1D2733',
  inkSoft: '#4A5563',
  /** hints and placeholders: darkened from #7B8593 (3.43:1 on paper) to clear 4.5:1 */
  inkFaint: '#5E6774',
  paper: '#F7F5F0',
  card: '#FFFFFF',
  rule: '#DAD5CB',
  /** input and chip edges: #B9B2A5 measured 2.1:1 on white (WCAG 1.4.11 asks 3:1) */
  ruleStrong: '#8E877A',
  /** the accent: darkened from #B35C2E (4.29:1 under paper text) to clear 4.5:1 both ways */
  copper: '#9A4A20',
  copperSoft: '#F3E3D8',
  danger: '#B8322A',
  dangerSoft: '#F7E0DE',
  /** amber as text and edges: #C77B1A measured 2.9:1 as text on white */
  warn: '#8A5200',
  warnSoft: '#FBEBD3',
  ok: '#5E7D46',
  p1: '#B8322A',
  p2: '#C77B1A',
  p3: '#2F6F95',
  p4: '#5E7D46',
  p1Soft: '#F7E0DE',
  p2Soft: '#FBEBD3',
  p3Soft: '#DDEAF2',
  p4Soft: '#E4EDDD',
  /** the bus phases carry their letter everywhere; the tint only helps the eye follow a row */
  phaseA: '#EDE7DC',
  phaseB: '#E2E8EC',
  phaseC: '#E8E4EE',
  /** schedule rows: the second space of a 2/3-pole breaker, a spare, an empty space */
  rowContinuation: '#FBFAF7',
  rowSpare: '#FAF6EF',
  rowSpace: '#F1EFEA',
  cellEmpty: '#FCFBF9',
  /** the header bar and what is written on it */
  bar: '#1D2733',
  onBar: '#F7F5F0',
} as const;

export type ColourToken = keyof typeof light;

const dark: Record<ColourToken, string> = {
  ink: '#F2EFE8',
  inkSoft: '#C5CBD3',
  inkFaint: '#A7AFBA',
  paper: '#0E1217',
  card: '#1A2129',
  rule: '#38414C',
  ruleStrong: '#6B7583',
  copper: '#F0A878',
  copperSoft: '#3B2418',
  danger: '#FF9A8F',
  dangerSoft: '#3D1C1A',
  warn: '#F4BE6A',
  warnSoft: '#3A2A10',
  ok: '#A6CF8A',
  p1: '#FF9A8F',
  p2: '#F4BE6A',
  p3: '#8CC4E8',
  p4: '#A6CF8A',
  p1Soft: '#3D1C1A',
  p2Soft: '#3A2A10',
  p3Soft: '#15303F',
  p4Soft: '#20301A',
  phaseA: '#2B2720',
  phaseB: '#1F2A31',
  phaseC: '#29222F',
  rowContinuation: '#161C23',
  rowSpare: '#221E18',
  rowSpace: '#12171D',
  cellEmpty: '#151A20',
  bar: '#000000',
  onBar: '#F2EFE8',
};

export const PALETTES: Record<ColourScheme, Record<ColourToken, string>> = { light, dark };

/**
 * Every text/ground pair the app draws, as [text, ground]: the contrast test checks each in both
 * palettes. A new pairing in a component (a tone on a tint) belongs here first.
 */
export const TEXT_PAIRS: readonly (readonly [ColourToken, ColourToken])[] = [
  // body text, secondary text, hints on the page and in cards
  ...(['ink', 'inkSoft', 'inkFaint', 'copper', 'danger', 'warn'] as const).flatMap((text) =>
    (['paper', 'card'] as const).map((ground) => [text, ground] as const),
  ),
  // tinted blocks: cautions, problems, selected rows, the bus phases, schedule rows
  ...(['copperSoft', 'dangerSoft', 'warnSoft', 'phaseA', 'phaseB', 'phaseC', 'rowContinuation', 'rowSpare', 'rowSpace', 'cellEmpty'] as const).flatMap(
    (ground) => (['ink', 'inkSoft'] as const).map((text) => [text, ground] as const),
  ),
  ['inkFaint', 'rowSpace'],
  ['danger', 'dangerSoft'],
  ['warn', 'warnSoft'],
  ['copper', 'copperSoft'],
  // priority chips: ink on each priority's tint
  ['ink', 'p1Soft'],
  ['ink', 'p2Soft'],
  ['ink', 'p3Soft'],
  ['ink', 'p4Soft'],
  // text on a strong ground: buttons, selected chips, tags, the sync status pills
  ['paper', 'copper'],
  ['paper', 'danger'],
  ['paper', 'ink'],
  ['paper', 'inkSoft'],
  // the header bar and the tab bar
  ['onBar', 'bar'],
  ['copper', 'card'],
  ['inkSoft', 'card'],
];

/** Non-text parts that must be told apart from their ground (WCAG 2.1 §1.4.11: 3:1). */
export const NON_TEXT_PAIRS: readonly (readonly [ColourToken, ColourToken])[] = [
  ['ruleStrong', 'card'],
  ['copper', 'card'],
  ['danger', 'card'],
  ['warn', 'card'],
  ['p1', 'card'],
  ['p2', 'card'],
  ['p3', 'card'],
  ['p4', 'card'],
];
