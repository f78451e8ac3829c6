/**
 * A typed door card of a 42-space panel, rendered to PNG with the app's shipped font (IBM Plex
 * Mono, fonts/) through sharp, in the variants a phone photo brings: clean, turned a few degrees,
 * faded (lower contrast) and grainy (noise). Used by the recognition test (tests/unit) and the
 * browser test (tests/e2e/door-card.spec.ts). The text is invented; the layout is the usual
 * odd-left / even-right directory [CP].
 */
import path from 'node:path';
import sharp from 'sharp';

export type Variant = 'clean' | 'rotated' | 'faded' | 'noisy';
export const VARIANTS: readonly Variant[] = ['clean', 'rotated', 'faded', 'noisy'];

/** [position, what is typed after the position, the circuit it means: poles, rating, description, status] */
type Entry = [number, string, 1 | 2 | 3, number | null, string, 'in-use' | 'spare' | 'space'];
const E = (p: number, typed: string, poles: 1 | 2 | 3, ratingA: number | null, description: string, status: Entry[5] = 'in-use'): Entry => [
  p,
  typed,
  poles,
  ratingA,
  description,
  status,
];

/** Entries at positions a multi-pole breaker covers are typed "--" and fold into it. */
export const CARD_ENTRIES: readonly Entry[] = [
  E(1, '20A Lobby lights', 1, 20, 'Lobby lights'),
  E(2, '20A Corridor receptacles', 1, 20, 'Corridor receptacles'),
  E(3, '2P-30 Water heater', 2, 30, 'Water heater'),
  E(4, '20A Exam 1 receptacles', 1, 20, 'Exam 1 receptacles'),
  E(5, '--', 2, 30, ''),
  E(6, '20A Exam 2 receptacles', 1, 20, 'Exam 2 receptacles'),
  E(7, 'Exam 3 receptacles 20A', 1, 20, 'Exam 3 receptacles'),
  E(8, '15A Exit signs', 1, 15, 'Exit signs'),
  E(9, 'Break room counter 20A', 1, 20, 'Break room counter'),
  E(10, '20A Break room fridge', 1, 20, 'Break room fridge'),
  E(11, '30/2 Dryer', 2, 30, 'Dryer'),
  E(12, '20A Office 116 and 117', 1, 20, 'Office 116 and 117'),
  E(13, '--', 2, 30, ''),
  E(14, '20A Reception desk', 1, 20, 'Reception desk'),
  E(15, '20A Waiting room lights', 1, 20, 'Waiting room lights'),
  E(16, 'Copier 20A', 1, 20, 'Copier'),
  E(17, 'SPARE 20A', 1, 20, '', 'spare'),
  E(18, '20A Server closet', 1, 20, 'Server closet'),
  E(19, '3P-40 Rooftop unit 1', 3, 40, 'Rooftop unit 1'),
  E(20, '20A Lab bench 1', 1, 20, 'Lab bench 1'),
  E(21, '--', 3, 40, ''),
  E(22, '20A Lab bench 2', 1, 20, 'Lab bench 2'),
  E(23, '--', 3, 40, ''),
  E(24, '20A Sterilizer', 1, 20, 'Sterilizer'),
  E(25, '20A Nurse station', 1, 20, 'Nurse station'),
  E(26, 'SPACE', 1, null, '', 'space'),
  E(27, 'Exam 4 lights 15A', 1, 15, 'Exam 4 lights'),
  E(28, 'SPACE', 1, null, '', 'space'),
  E(29, '20A Exam 5 receptacles', 1, 20, 'Exam 5 receptacles'),
  E(30, '20A Exterior lights', 1, 20, 'Exterior lights'),
  E(31, '2P-20 Condensing unit', 2, 20, 'Condensing unit'),
  E(32, '20A Water cooler', 1, 20, 'Water cooler'),
  E(33, '--', 2, 20, ''),
  E(34, '20A Fire alarm panel', 1, 20, 'Fire alarm panel'),
  E(35, '20A Staff room', 1, 20, 'Staff room'),
  E(36, 'SPARE', 1, null, '', 'spare'),
  E(37, '20A Hall lights north', 1, 20, 'Hall lights north'),
  E(38, '20A Hall lights south', 1, 20, 'Hall lights south'),
  E(39, 'SPARE', 1, null, '', 'spare'),
  E(40, 'SPACE', 1, null, '', 'space'),
  E(41, 'SPACE', 1, null, '', 'space'),
  E(42, 'SPACE', 1, null, '', 'space'),
];

/** The circuits the card means (continuation lines folded), by position. */
export const CARD_CIRCUITS = CARD_ENTRIES.filter(([, typed]) => typed !== '--').map(([position, , poles, ratingA, description, status]) => ({
  position,
  poles,
  ratingA,
  description,
  status,
}));

const HEADING = 'PANEL LB  208Y/120V 3PH 4W  DIRECTORY';
const LEFT_WIDTH = 34;

/** The typed lines: the heading, then one line per row, odd position left, even right. */
export function cardText(): string[] {
  const lines = [HEADING, ''];
  for (let p = 1; p <= 42; p += 2) {
    const left = CARD_ENTRIES[p - 1];
    const right = CARD_ENTRIES[p];
    lines.push(`${String(left[0]).padStart(2)} ${left[1]}`.padEnd(LEFT_WIDTH) + `${String(right[0]).padStart(2)} ${right[1]}`);
  }
  return lines;
}

const FONT = path.join(__dirname, '../../fonts/IBMPlexMono_400Regular.ttf');

/** A small deterministic generator, so a variant's noise is the same on every run. */
function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
}

/** The card as a PNG: typed at 11 pt, 200 dpi, on white, in the variant asked for. */
export async function renderCard(variant: Variant): Promise<Buffer> {
  const escaped = cardText()
    .join('\n')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;');
  const text = await sharp({
    text: { text: `<span foreground="#161616">${escaped}</span>`, fontfile: FONT, font: 'IBM Plex Mono 11', dpi: 200, rgba: true, spacing: 14 },
  })
    .png()
    .toBuffer();
  let card = sharp(text).flatten({ background: '#ffffff' }).extend({ top: 80, bottom: 80, left: 80, right: 80, background: '#ffffff' });
  if (variant === 'rotated') card = sharp(await card.png().toBuffer()).rotate(2.5, { background: '#ffffff' });
  // a faded ribbon on yellowed card: ink at about 55 % grey, paper slightly dark
  if (variant === 'faded') card = sharp(await card.png().toBuffer()).greyscale().linear(0.45, 120);
  if (variant === 'noisy') {
    const { data, info } = await card.greyscale().raw().toBuffer({ resolveWithObject: true });
    const random = lcg(15);
    for (let i = 0; i < data.length; i += 1) {
      // grain of ±40 grey levels, and 1 % of pixels flecked dark or light
      const r = random();
      const fleck = r < 0.005 ? -180 : r > 0.995 ? 180 : 0;
      data[i] = Math.max(0, Math.min(255, data[i] + Math.round((random() - 0.5) * 80) + fleck));
    }
    return sharp(data, { raw: { width: info.width, height: info.height, channels: info.channels } }).png().toBuffer();
  }
  return card.png().toBuffer();
}
