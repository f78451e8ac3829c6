/**
 * The panel checks in the printed report: the fault-current check (NEC 110.9/110.10, from
 * shared/panel-checks.ts like the panel screen), the breakers' identity and verification at the
 * panel, clamp readings with the neutral by phasor sum (with its non-linear caution), and a thermal
 * reading's camera settings and component temperature against its rating.
 */
import { In, type EntityManager } from 'typeorm';
import { NEUTRAL_CAUTION, componentTempCheck, neutralCurrentA } from '../../../shared/calc';
import { SYSTEM_INFO } from '../../../shared/domain';
import { breakerName, componentRatingC, faultSourceText, panelFaultCheck } from '../../../shared/panel-checks';
import { formatTemp, type TemperatureUnit } from '../../../shared/units';
import { User, type Circuit, type Panel, type Reading } from '../../entities';
import { FONT, INK, PRIORITY_COLOURS, SOFT, printable, type PrintedLine } from './fonts';

/** Display names of the people who verified breakers (ids of rows the report prints). */
export async function verifierNames(em: EntityManager, circuits: readonly Circuit[]): Promise<Map<string, string>> {
  const ids = [...new Set(circuits.map((c) => c.verifiedBy).filter((id): id is string => !!id))];
  const users = ids.length ? await em.find(User, { where: { id: In(ids) } }) : [];
  return new Map(users.map((u) => [u.id, u.name]));
}

/** "emissivity 0.95; reflected 22 °C; 1.2 m; camera Handheld IR 320", in the report's unit */
export function thermographyText(r: Reading, unit: TemperatureUnit): string | null {
  if (r.kind !== 'thermal') return null;
  return (
    [
      r.emissivity !== null ? `emissivity ${r.emissivity}` : null,
      r.reflectedC !== null ? `reflected ${formatTemp(r.reflectedC, unit, 'absolute')}` : null,
      r.distanceM !== null ? `${r.distanceM} m` : null,
      r.camera ? `camera ${r.camera}` : null,
    ]
      .filter(Boolean)
      .join('; ') || null
  );
}

/** The component's own temperature against its insulation/termination rating, or null. */
export function componentTempText(r: Reading, circuit: Circuit | undefined, panel: Panel | undefined): { text: string; over: boolean } | null {
  if (r.kind !== 'thermal' || r.temperatureC === null || !panel) return null;
  const rating = componentRatingC(circuit, panel);
  if (!rating) return null;
  const check = componentTempCheck({ componentC: r.temperatureC, ratingC: rating.ratingC });
  return { text: `Component temperature: ${check.message} (${rating.basis}; NEC 110.14(C))`, over: check.over };
}

/**
 * The fault-current, breaker and clamp-reading lines of one panel, under its load: as lines, so
 * the report can measure them and keep the last panel together with the sign-off.
 */
export function panelChecksLines(panel: Panel, circuits: readonly Circuit[], names: ReadonlyMap<string, string>): PrintedLine[] {
  const lines: PrintedLine[] = [];
  const line = (font: string, size: number, colour: string, text: string) => lines.push({ font, size, colour, text });
  const check = panelFaultCheck(panel, circuits);
  if (!check.judged) {
    line(FONT.text, 9, SOFT, check.reason);
  } else {
    const below = check.findings.length;
    const source = faultSourceText(panel);
    line(FONT.bold, 9.5, below ? PRIORITY_COLOURS[1] : INK,
      `Available fault current ${check.availableKA} kA${source ? ` (${source})` : ''}: ${below ? `${below} rated below it` : 'every recorded rating is at least that'} (NEC 110.9, 110.10).`);
    for (const f of check.findings) line(FONT.text, 9, INK, printable(f.message));
    if (check.notRecorded.length) line(FONT.text, 8.5, SOFT, `Rating not recorded, not judged: ${check.notRecorded.length} (${check.notRecorded.slice(0, 4).join(', ')}${check.notRecorded.length > 4 ? ', …' : ''}).`);
    if (check.seriesNote) line(FONT.text, 8.5, SOFT, printable(`${check.seriesNote}${panel.seriesRatingNote ? ` Marked: ${panel.seriesRatingNote}.` : ''}`));
  }
  const breakers = circuits.filter((c) => c.status !== 'space');
  const verified = breakers.filter((c) => c.verifiedOn);
  line(FONT.text, 9, INK, `Verified at the panel: ${verified.length} of ${breakers.length} breakers.`);
  for (const c of verified.slice(0, 12)) {
    const identity = [c.breakerMake, c.catalogueNumber].filter(Boolean).join(' ');
    line(FONT.mono, 8.5, SOFT,
      printable(`${breakerName(c)}${identity ? ` ${identity}` : ''}${c.interruptingKA ? `, ${c.interruptingKA} kA` : ''}: verified on ${c.verifiedOn} by ${names.get(c.verifiedBy ?? '') ?? 'someone no longer listed'}`));
  }
  if (verified.length > 12) line(FONT.text, 8.5, SOFT, `and ${verified.length - 12} more.`);
  const phases = [panel.measuredA, panel.measuredB, panel.measuredC];
  if (phases.some((x) => x !== null) || panel.measuredN !== null) {
    const fourWire = SYSTEM_INFO[panel.system].phases === 3 && SYSTEM_INFO[panel.system].neutralV !== null;
    const [a, b, c] = phases;
    const neutral = fourWire && a !== null && b !== null && c !== null ? neutralCurrentA(a, b, c) : null;
    const words = [
      ['A', a], ['B', b], ['C', c], ['N', panel.measuredN],
    ].filter(([, x]) => x !== null).map(([p, x]) => `${p} ${x} A`).join(' · ');
    line(FONT.mono, 9, INK, `Measured${panel.measuredOn ? ` ${panel.measuredOn}` : ''}: ${words}${neutral !== null ? ` · neutral from the phases ${neutral.toFixed(1)} A` : ''}`);
    if (neutral !== null) line(FONT.text, 8.5, SOFT, NEUTRAL_CAUTION);
  }
  return lines;
}
