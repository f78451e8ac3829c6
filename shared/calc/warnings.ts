/**
 * Per-circuit warnings for the panel schedule, in plain words for an electrician.
 *
 * Combines: conductor ampacity against the breaker (NEC Table 310.16, 240.4(B), 110.14(C)),
 * small-conductor limits (NEC 240.4(D)), continuous load over 80 % of the rating (NEC 210.20(A):
 * the rating must be ≥ 125 % of the continuous load), voltage drop over 3 % (NEC 210.19(A)
 * Informational Note, advice), and the directory checks of NEC 408.4(A).
 */
import { SYSTEM_INFO, conductorSizeLabel } from '../domain';
import type {
  CircuitStatus,
  ConductorMaterial,
  ConductorSize,
  InsulationTempC,
  LoadKind,
  PanelSystem,
} from '../domain';
import { conductorCheck, smallConductorLimitA } from './conductors';
import { nonNegative, positive } from './guard';
import { directoryWarnings } from './directory';
import type { DirectoryWarningCode } from './directory';
import { phaseOf } from './layout';
import { circuitCurrentA, phaseToNeutralV } from './loads';
import { BRANCH_VOLTAGE_DROP_ADVICE_PCT, voltageDrop } from './voltage-drop';

export type CircuitWarningCode =
  | 'conductor-too-small'
  | 'small-conductor-limit'
  | 'conductor-not-in-table'
  | 'load-over-rating'
  | 'continuous-over-80'
  | 'voltage-drop'
  | 'high-leg-single-pole'
  | DirectoryWarningCode;

export interface CircuitWarning {
  code: CircuitWarningCode;
  severity: 'warning' | 'info';
  message: string;
}

export interface WarningCircuit {
  position: number;
  poles: number;
  ratingA: number | null;
  status: CircuitStatus;
  description: string | null;
  loadVA: number | null;
  continuous: boolean;
  conductorSize: ConductorSize | null;
  conductorMaterial: ConductorMaterial | null;
  insulationTempC: InsulationTempC | null;
  /** one-way length */
  lengthFt: number | null;
  /** optional: motor and HVAC circuits are sized by NEC Articles 430/440, so conductor checks soften */
  loadKind?: LoadKind | null;
  /** this breaker's termination rating when it differs from the panel's; null/absent: the panel's */
  terminationTempC?: InsulationTempC | null;
  /** ambient where the conductors run, °C (Table 310.15(B)(1)); null/absent: 30 °C */
  ambientC?: number | null;
  /** current-carrying conductors together (Table 310.15(C)(1)); null/absent: 3 or fewer */
  currentCarrying?: number | null;
}

export interface WarningPanel {
  system: PanelSystem;
  /**
   * the rating the panel's terminations are listed and marked for; null/absent when not known, and
   * then NEC 110.14(C)(1) applies (60 °C for 100 A or less or 14–1 AWG)
   */
  terminationTempC?: InsulationTempC | null;
}

/** Continuous load may use at most this fraction of the rating (1 / 1.25, NEC 210.20(A)). */
export const CONTINUOUS_LOAD_MAX_FRACTION = 0.8;

/**
 * All warnings for one circuit. Checks whose inputs are missing are skipped; a space (no breaker)
 * gets no conductor or load checks. Motor and HVAC circuits (loadKind 'motor' / 'hvac') get the
 * conductor findings as 'info': NEC 240.4(G) sends them to Articles 430/440 (from memory), where a
 * breaker larger than the wire's ampacity can be correct.
 * @throws RangeError when the rating is not > 0 or the load or length is negative, or any of them
 * is not a finite number.
 */
export function circuitWarnings(circuit: WarningCircuit, panel: WarningPanel): CircuitWarning[] {
  if (circuit.ratingA !== null) positive('ratingA', circuit.ratingA);
  if (circuit.loadVA !== null) nonNegative('loadVA', circuit.loadVA);
  if (circuit.lengthFt !== null) nonNegative('lengthFt', circuit.lengthFt);
  const warnings: CircuitWarning[] = [];
  const { system } = panel;
  const info = SYSTEM_INFO[system];
  const validPlace =
    Number.isInteger(circuit.position) && circuit.position >= 1 &&
    Number.isInteger(circuit.poles) && circuit.poles >= 1 && circuit.poles <= 3 &&
    (info.phases === 3 || circuit.poles < 3);

  if (circuit.status !== 'space') {
    const motorLike = circuit.loadKind === 'motor' || circuit.loadKind === 'hvac';
    const conductorSeverity = motorLike ? 'info' : 'warning';
    const motorNote = motorLike
      ? ' For a motor or HVAC circuit, check against the nameplate and NEC Article 430/440 instead.'
      : '';
    const { ratingA, conductorSize: size, conductorMaterial: material } = circuit;

    if (ratingA !== null && size !== null && material !== null) {
      const wire = `${conductorSizeLabel(size)} ${material === 'Cu' ? 'copper' : 'aluminium'}`;
      if (circuit.insulationTempC !== null) {
        const check = conductorCheck({
          ratingA,
          size,
          material,
          insulationTempC: circuit.insulationTempC,
          terminalTempC: circuit.terminationTempC ?? panel.terminationTempC ?? null,
          ambientC: circuit.ambientC ?? null,
          currentCarrying: circuit.currentCarrying ?? null,
        });
        if (check.ampacityA === null) {
          // an ambient the insulation may not be used at says so; otherwise the size is not in the table
          const notAllowed = check.reasons.find((r) => r.includes('310.15(B)(1)'));
          warnings.push({
            code: 'conductor-not-in-table',
            severity: 'warning',
            message: notAllowed ?? `${wire} has no ampacity in NEC Table 310.16: check the conductor size.`,
          });
        } else if (check.overAmpacity) {
          warnings.push({
            code: 'conductor-too-small',
            severity: conductorSeverity,
            message:
              `${wire} is too small for a ${ratingA} A breaker: it is good for ${Math.round(check.ampacityA * 10) / 10} A ` +
              `at ${check.tempC} °C (NEC Table 310.16${check.correctionBasis ? `, ${check.correctionBasis}` : ''}; ${check.terminationBasis})` +
              (check.nextSizeUpApplied ? `, so ${check.allowedByAmpacityA} A at most with the next size up (240.4(B))` : '') +
              '. Fit a smaller breaker or a larger wire.' + motorNote,
          });
        }
      }
      const limitA = smallConductorLimitA(size, material);
      if (limitA !== null && ratingA > limitA) {
        warnings.push({
          code: 'small-conductor-limit',
          severity: conductorSeverity,
          message:
            `NEC 240.4(D) allows at most a ${limitA} A breaker on ${wire}; this one is ${ratingA} A.` +
            motorNote,
        });
      }
    }

    const amps =
      validPlace && circuit.loadVA !== null
        ? circuitCurrentA({ system, position: circuit.position, poles: circuit.poles, loadVA: circuit.loadVA })
        : null;

    if (amps !== null && ratingA !== null && ratingA > 0) {
      if (amps > ratingA) {
        warnings.push({
          code: 'load-over-rating',
          severity: 'warning',
          message: `The load draws about ${round(amps)} A, more than the ${ratingA} A breaker.`,
        });
      } else if (circuit.continuous && amps > CONTINUOUS_LOAD_MAX_FRACTION * ratingA) {
        warnings.push({
          code: 'continuous-over-80',
          severity: 'warning',
          message:
            `Continuous load of about ${round(amps)} A is over 80 % of the ${ratingA} A breaker ` +
            `(${round(CONTINUOUS_LOAD_MAX_FRACTION * ratingA)} A). NEC 210.20(A) needs a breaker of at least ` +
            `125 % of the continuous load unless it is listed for 100 % duty.`,
        });
      }
    }

    if (amps !== null && circuit.lengthFt !== null && circuit.lengthFt > 0 && size !== null && material !== null) {
      const volts =
        circuit.poles === 1 ? phaseToNeutralV(system, phaseOf(system, circuit.position)) : info.lineV;
      const drop = voltageDrop({
        size,
        material,
        amps,
        lengthFt: circuit.lengthFt,
        volts,
        phases: circuit.poles === 3 ? 3 : 1,
      });
      if (drop !== null && drop.percent > BRANCH_VOLTAGE_DROP_ADVICE_PCT) {
        warnings.push({
          code: 'voltage-drop',
          severity: 'warning',
          message:
            `About ${round(drop.percent)} % voltage drop (${round(drop.volts)} V of ${round(volts)} V) over ` +
            `${circuit.lengthFt} ft of ${conductorSizeLabel(size)}. The NEC advises no more than 3 % on a ` +
            'branch circuit (210.19(A) note): consider a larger wire.',
        });
      }
    }

    if (
      system === '120/240V-3ph-4w-highleg' && validPlace && circuit.poles === 1 &&
      phaseOf(system, circuit.position) === 'B'
    ) {
      warnings.push({
        code: 'high-leg-single-pole',
        severity: 'warning',
        message:
          'This 1-pole position is on the high leg (phase B, about 208 V to neutral): a 120 V load ' +
          'here gets 208 V. Check what it feeds.',
      });
    }
  }

  for (const w of directoryWarnings(circuit.description, circuit.status)) {
    warnings.push({ ...w, severity: w.code === 'directory-says-spare' ? 'info' : 'warning' });
  }
  return warnings;
}

function round(value: number): number {
  return Math.round(value * 10) / 10;
}
