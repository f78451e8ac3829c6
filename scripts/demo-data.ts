/**
 * Ampwright demo scenario — every organisation, person, building, street and tenant here is invented.
 * Maker / model fields are generic descriptions, not brands.
 *
 * Three buildings looked after by one contracting organisation:
 *   - Brackenfold Family Clinic (single storey, 208Y/120 V service)          — granted to the owner demo user
 *   - Copperwick Lofts (shops at ground level, flats above, 480Y/277 V service, a 480–208Y/120 V
 *     transformer T-1 feeding the 208Y/120 V distribution panel DP-1)
 *   - Wrenfold Cottage (caretaker's house, 120/240 V 1φ load centre + detached garage sub-panel)
 *
 * DELIBERATE PROBLEMS for the app to flag (the demo exists to show them):
 *   1. clinic-LB pos 13 "Break room microwave": 20 A breaker on 14 AWG Cu
 *      (NEC 240.4(D): 14 AWG Cu max 15 A).
 *   2. lofts-1LA pos 25 "misc": vague directory text (NEC 408.4(A) wants the specific purpose).
 *   3. clinic-LA pos 27 "Dana's office": identifies a person, not a permanent room or use
 *      (NEC 408.4(A) — must not depend on transient conditions of occupancy).
 *   4. clinic-LA pos 31 "Monument sign & drive lights": 20 A, 12 AWG Cu, 160 ft one-way, 1800 VA at
 *      120 V → about 9.5 V ≈ 7.9 % voltage drop (well past the 3 % branch-circuit recommendation).
 *   5. cottage-LC1 pos 1 "Range": 50 A on 8 AWG Cu in an older load centre whose termination rating
 *      was not recorded: NEC 110.14(C)(1)(a) takes the 60 °C column (40 A), so the 50 A breaker is
 *      too big for the wire; with terminations marked 75 °C it would be 50 A and fine.
 * Every other panel records terminations listed and marked 75 °C.
 * Everything else is meant to be clean: conductors match breaker ratings (some 120 V runs are
 * upsized to 10 AWG for voltage drop and say so in notes), continuous loads stay within 80 % of the
 * breaker, and every panel's positions 1..spaces are covered (trailing spaces are generated).
 */
import type {
  BreakerType,
  CircuitStatus,
  ConductorSize,
  LoadKind,
  PanelKind,
  PanelSystem,
} from '../shared/domain';
import { percentOfNormal } from '../shared/calc/thermal';

export interface DemoCircuit {
  /** starting position (odd left column, even right column) */
  position: number;
  poles: 1 | 2 | 3;
  /** null only for a space */
  ratingA: number | null;
  breakerType: BreakerType;
  /** circuit directory text, specific per NEC 408.4(A) */
  description: string;
  loadKind: LoadKind;
  loadVA: number | null;
  continuous: boolean;
  conductorSize: ConductorSize | null;
  conductorMaterial: 'Cu' | 'Al' | null;
  insulationTempC: 60 | 75 | 90 | null;
  /** this breaker's termination rating when it differs from the panel's; null = the panel's */
  terminationTempC: 60 | 75 | 90 | null;
  /** one-way length */
  lengthFt: number | null;
  status: CircuitStatus;
  /** for feeder breakers: the key of the panel it feeds */
  feedsPanelKey?: string;
  handleLock: boolean;
  notes: string;
  /** the breaker as marked (NEC 110.9); absent = not recorded */
  interruptingKA?: number | null;
  breakerMake?: string;
  catalogueNumber?: string;
}

/** What a panel's checks record (issue 13): absent = not recorded. */
export interface DemoPanelChecks {
  availableFaultKA?: number | null;
  availableFaultOn?: string | null;
  availableFaultSource?: 'label' | 'utility' | 'engineer' | null;
  seriesRated?: boolean;
  seriesRatingNote?: string;
  feederRatingA?: number | null;
  peakDemand?: number | null;
  peakDemandUnit?: 'A' | 'kVA' | null;
  peakDemandBasis?: 'year' | '30-day' | null;
  peakDemandOn?: string | null;
  measuredA?: number | null;
  measuredB?: number | null;
  measuredC?: number | null;
  measuredN?: number | null;
  measuredOn?: string | null;
}

export interface DemoPanel extends DemoPanelChecks {
  /** stable key within the scenario, e.g. 'clinic-MDP' */
  key: string;
  tag: string;
  location: string;
  kind: PanelKind;
  system: PanelSystem;
  busRatingA: number;
  /** null = main lugs only */
  mainRatingA: number | null;
  shortCircuitKA: number;
  /** what the terminations are listed and marked for; null = not recorded (NEC 110.14(C)(1) → 60 °C ≤ 100 A) */
  terminationTempC: 60 | 75 | 90 | null;
  spaces: number;
  fedFromPanelKey: string | null;
  fedFromPosition: number | null;
  maker: string;
  model: string;
  /** 'YYYY-MM-DD' */
  installedOn: string;
  /** NFPA 70B 2023 equipment condition */
  condition: 1 | 2 | 3;
  circuits: DemoCircuit[];
}

export interface DemoBuilding {
  key: string;
  name: string;
  address: string;
  notes: string;
  panels: DemoPanel[];
}

// ---------------------------------------------------------------------------------------------
// Small builders so the schedules below read like a panel directory.
// ---------------------------------------------------------------------------------------------

/** Copper conductor for a breaker rating (75 °C terminations, NEC 310.16 / 240.4(B)/(D)). */
function conductorFor(ratingA: number): ConductorSize {
  if (ratingA <= 15) return '14';
  if (ratingA <= 20) return '12';
  if (ratingA <= 30) return '10';
  if (ratingA <= 50) return '8';
  if (ratingA <= 65) return '6';
  if (ratingA <= 85) return '4';
  if (ratingA <= 100) return '3';
  if (ratingA <= 115) return '2';
  if (ratingA <= 130) return '1';
  if (ratingA <= 150) return '1/0';
  if (ratingA <= 175) return '2/0';
  if (ratingA <= 200) return '3/0';
  if (ratingA <= 230) return '4/0';
  if (ratingA <= 255) return '250';
  if (ratingA <= 310) return '350';
  return '500';
}

type CircuitOpts = Partial<
  Pick<
    DemoCircuit,
    | 'breakerType'
    | 'continuous'
    | 'conductorSize'
    | 'conductorMaterial'
    | 'insulationTempC'
    | 'handleLock'
    | 'notes'
  >
>;

/** An in-use branch circuit. */
function ckt(
  position: number,
  poles: 1 | 2 | 3,
  ratingA: number,
  description: string,
  loadKind: LoadKind,
  loadVA: number,
  lengthFt: number | null,
  opts: CircuitOpts = {},
): DemoCircuit {
  return {
    position,
    poles,
    ratingA,
    breakerType: opts.breakerType ?? 'standard',
    description,
    loadKind,
    loadVA,
    continuous: opts.continuous ?? loadKind === 'lighting',
    conductorSize: opts.conductorSize ?? conductorFor(ratingA),
    conductorMaterial: opts.conductorMaterial ?? 'Cu',
    insulationTempC: opts.insulationTempC ?? 90,
    terminationTempC: null,
    lengthFt,
    status: 'in-use',
    handleLock: opts.handleLock ?? false,
    notes: opts.notes ?? '',
  };
}

/** A feeder breaker; its loadVA is filled in from the fed panel's connected load. */
function feeder(
  position: number,
  poles: 2 | 3,
  ratingA: number,
  description: string,
  feedsPanelKey: string,
  lengthFt: number,
  opts: CircuitOpts = {},
): DemoCircuit {
  return {
    ...ckt(position, poles, ratingA, description, 'feeder', 0, lengthFt, opts),
    loadVA: null,
    continuous: false,
    feedsPanelKey,
  };
}

/** A breaker with nothing connected to it. */
function spare(position: number, ratingA: number, poles: 1 | 2 | 3 = 1, notes = ''): DemoCircuit {
  return {
    position,
    poles,
    ratingA,
    breakerType: 'standard',
    description: 'Spare',
    loadKind: 'other',
    loadVA: null,
    continuous: false,
    conductorSize: null,
    conductorMaterial: null,
    insulationTempC: null,
    terminationTempC: null,
    lengthFt: null,
    status: 'spare',
    handleLock: false,
    notes,
  };
}

/** An empty position (no breaker). */
function space(position: number): DemoCircuit {
  return {
    position,
    poles: 1,
    ratingA: null,
    breakerType: 'standard',
    description: '',
    loadKind: 'other',
    loadVA: null,
    continuous: false,
    conductorSize: null,
    conductorMaterial: null,
    insulationTempC: null,
    terminationTempC: null,
    lengthFt: null,
    status: 'space',
    handleLock: false,
    notes: '',
  };
}

/** Positions a circuit occupies: n, n+2, n+4 … (standard panelboard numbering). */
function occupiedPositions(c: Pick<DemoCircuit, 'position' | 'poles'>): number[] {
  return Array.from({ length: c.poles }, (_, i) => c.position + 2 * i);
}

/** Adds a space for every position 1..spaces not taken by a breaker, then sorts by position. */
function withSpaces(spaces: number, circuits: DemoCircuit[]): DemoCircuit[] {
  const taken = new Set(circuits.flatMap(occupiedPositions));
  const all = [...circuits];
  for (let p = 1; p <= spaces; p++) if (!taken.has(p)) all.push(space(p));
  return all.sort((a, b) => a.position - b.position);
}

type PanelInput = Omit<DemoPanel, 'circuits'>;
function panel(p: PanelInput, circuits: DemoCircuit[]): DemoPanel {
  return { ...p, circuits: withSpaces(p.spaces, circuits) };
}

/**
 * Every breaker of a panel marked alike (make, catalogue number by rating, interrupting rating),
 * except the positions given, e.g. a replacement breaker of another series.
 */
function marked(
  p: DemoPanel,
  breaker: { make: string; catalogue: (ratingA: number, poles: number) => string; interruptingKA: number },
  except: Record<number, Partial<Pick<DemoCircuit, 'interruptingKA' | 'breakerMake' | 'catalogueNumber' | 'notes'>>> = {},
): DemoPanel {
  const circuits = p.circuits.map((c) =>
    c.status === 'space' || c.ratingA === null
      ? c
      : {
          ...c,
          interruptingKA: breaker.interruptingKA,
          breakerMake: breaker.make,
          catalogueNumber: breaker.catalogue(c.ratingA, c.poles),
          ...except[c.position],
        },
  );
  return { ...p, circuits };
}

const UPSIZED = 'Upsized to 10 AWG for voltage drop on the long run.';

// ---------------------------------------------------------------------------------------------
// Brackenfold Family Clinic
// ---------------------------------------------------------------------------------------------

const clinicMDP = panel(
  {
    key: 'clinic-MDP',
    tag: 'MDP',
    location: 'Electrical room 104, north wall',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 400,
    mainRatingA: 400,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 30,
    fedFromPanelKey: null,
    fedFromPosition: null,
    maker: 'Distribution panelboard, bolt-on MCCBs',
    model: '400 A main breaker, 30 sp, copper bus',
    installedOn: '2011-06-14',
    condition: 2,
    availableFaultKA: 18,
    availableFaultOn: '2024-09-12',
    availableFaultSource: 'engineer',
  },
  [
    feeder(1, 3, 225, 'Panel LA (exam wing) feeder', 'clinic-LA', 35, {
      conductorSize: '300',
      conductorMaterial: 'Al',
      notes: 'XHHW-2 aluminium in EMT.',
    }),
    ckt(2, 3, 30, 'Surge protective device SPD-1', 'other', 0, 3, {
      breakerType: 'surge',
      notes: 'Status lights green at last visit.',
    }),
    feeder(7, 3, 100, 'Panel LB (lab & staff wing) feeder', 'clinic-LB', 110),
    ckt(8, 2, 60, 'X-ray generator, Imaging 112', 'appliance', 8000, 45, {
      notes: 'Momentary rating per equipment nameplate; disconnect in room 112.',
    }),
    ckt(12, 3, 30, 'Water heater WH-1 (storage, 6 kW)', 'appliance', 6000, 40, { continuous: true }),
    ckt(13, 3, 40, 'RTU-1 (exam wing rooftop unit)', 'hvac', 10800, 60, { continuous: true }),
    ckt(18, 3, 20, 'CU-1 condensing unit, IT closet split', 'hvac', 4200, 90, { continuous: true }),
    ckt(19, 3, 35, 'RTU-2 (waiting & reception rooftop unit)', 'hvac', 9000, 70, { continuous: true }),
    ckt(24, 1, 20, 'Fire alarm control panel FACP', 'other', 360, 40, {
      handleLock: true,
      notes: 'Red handle marking and lock per NEC 760.41(B).',
    }),
    spare(25, 100, 3),
  ],
);

const clinicLA = marked(panel(
  {
    key: 'clinic-LA',
    tag: 'LA',
    location: 'Corridor 120, recessed opposite Exam 4',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 225,
    mainRatingA: null,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 42,
    fedFromPanelKey: 'clinic-MDP',
    fedFromPosition: 1,
    maker: 'Branch-circuit panelboard, bolt-on',
    model: '225 A main lugs, 42 sp',
    installedOn: '2011-06-14',
    condition: 2,
    // invented figures: the 110.24 label at the panel, a year of demand from the utility's meter
    // data, and one round of clamp readings
    availableFaultKA: 14,
    availableFaultOn: '2025-03-01',
    availableFaultSource: 'label',
    feederRatingA: 225,
    peakDemand: 31.5,
    peakDemandUnit: 'kVA',
    peakDemandBasis: 'year',
    peakDemandOn: '2026-10-31',
    measuredA: 41.2,
    measuredB: 38,
    measuredC: 29.5,
    measuredN: 12.4,
    measuredOn: '2026-11-18',
  },
  [
    // left column
    ckt(1, 1, 20, 'Exam 1 & 2 receptacles', 'receptacles', 1080, 55),
    ckt(3, 1, 20, 'Exam 3 & 4 receptacles', 'receptacles', 1080, 70),
    ckt(5, 1, 20, 'Exam 5 & 6 receptacles', 'receptacles', 1080, 85),
    ckt(7, 1, 20, 'Exam 7 & 8 receptacles', 'receptacles', 1080, 100, {
      conductorSize: '10',
      notes: UPSIZED,
    }),
    ckt(9, 1, 20, 'Exam 1–4 lights', 'lighting', 960, 60),
    ckt(11, 1, 20, 'Exam 5–8 lights', 'lighting', 960, 90),
    ckt(13, 1, 20, 'Corridor lights east', 'lighting', 720, 75),
    ckt(15, 1, 20, 'Corridor lights west', 'lighting', 720, 80),
    ckt(17, 1, 20, 'Waiting room lights', 'lighting', 1100, 40),
    ckt(19, 1, 20, 'Reception desk receptacles', 'receptacles', 900, 35),
    ckt(21, 1, 20, 'Waiting room receptacles', 'receptacles', 720, 45),
    ckt(23, 1, 20, 'Patient restrooms 1 & 2 receptacles (GFCI)', 'receptacles', 360, 60, {
      breakerType: 'gfci',
    }),
    ckt(25, 1, 20, 'Nurse station receptacles', 'receptacles', 1080, 50),
    // deliberate problem 3: a person's name instead of a room
    ckt(27, 1, 20, "Dana's office", 'receptacles', 540, 65),
    ckt(29, 1, 20, 'Offices 116 & 117 receptacles', 'receptacles', 720, 70),
    // deliberate problem 4: long 120 V run, ≈ 7.9 % voltage drop
    ckt(31, 1, 20, 'Monument sign & drive lights', 'lighting', 1800, 160),
    ckt(33, 1, 20, 'Copier, reception workroom 115', 'appliance', 1400, 40),
    spare(35, 20),
    spare(37, 20),
    // right column
    ckt(2, 1, 20, 'Waiting room TV & check-in kiosk', 'receptacles', 360, 45),
    ckt(4, 1, 20, 'Exam 1–4 diagnostic wall sets', 'receptacles', 480, 60),
    ckt(6, 1, 20, 'Exam 5–8 diagnostic wall sets', 'receptacles', 480, 90),
    ckt(8, 1, 15, 'Restroom exhaust fans EF-2 & EF-3', 'motor', 240, 55, { continuous: true }),
    ckt(10, 2, 20, 'Mini-split MS-1, IT closet 118', 'hvac', 2000, 30, { continuous: true }),
    ckt(14, 1, 20, 'IT closet 118 rack receptacles', 'receptacles', 1440, 25),
    ckt(16, 1, 20, 'IT closet 118 UPS (L5-20)', 'appliance', 1600, 25, { continuous: true }),
    ckt(18, 1, 20, 'Drinking fountain, corridor 120 (GFCI)', 'appliance', 370, 50, {
      breakerType: 'gfci',
    }),
    ckt(20, 1, 20, 'Emergency egress units, unswitched leg', 'lighting', 240, 80, {
      handleLock: true,
      notes: 'Lock-on clip fitted; feeds battery unit equipment.',
    }),
    ckt(22, 1, 20, 'Vaccine refrigerator, nurse station', 'appliance', 600, 50, {
      handleLock: true,
      notes: 'Dedicated circuit; lock-on clip — do not switch off without the nurse lead.',
    }),
    ckt(24, 1, 20, 'Exterior receptacles, entrance & rear (GFCI, WR)', 'receptacles', 360, 70, {
      breakerType: 'gfci',
    }),
    ckt(26, 1, 20, 'Exit signs, all corridors', 'lighting', 120, 85, { handleLock: true }),
    ckt(28, 1, 20, 'Autoclave, soiled utility 121', 'appliance', 1500, 70, {
      conductorSize: '10',
      notes: UPSIZED,
    }),
    spare(30, 20),
    ckt(32, 1, 20, 'Door operators & access control panel ACP-1', 'other', 300, 60),
  ],
), {
  make: 'Halden Electric',
  catalogue: (ratingA, poles) => `HB${poles}${String(ratingA).padStart(3, '0')}`,
  interruptingKA: 22,
}, {
  // a replacement of another series: rated below the label's 14 kA, so the panel flags it (NEC 110.9)
  33: { interruptingKA: 10, breakerMake: 'Corve', catalogueNumber: 'CQ120', notes: 'Replacement breaker, 2019.' },
});

const clinicLB = panel(
  {
    key: 'clinic-LB',
    tag: 'LB',
    location: 'Staff corridor 125, beside Lab 110 door',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 100,
    mainRatingA: 100,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 30,
    fedFromPanelKey: 'clinic-MDP',
    fedFromPosition: 7,
    maker: 'Bolt-on panelboard, 30 sp',
    model: '100 A main breaker, 3φ 4W',
    installedOn: '2019-03-02',
    condition: 1,
  },
  [
    // left column
    ckt(1, 1, 20, 'Lab 110 bench receptacles north', 'receptacles', 900, 30),
    ckt(3, 1, 20, 'Lab 110 bench receptacles south', 'receptacles', 900, 35),
    ckt(5, 1, 20, 'Lab 110 centrifuge (dedicated)', 'appliance', 1000, 30),
    ckt(7, 1, 20, 'Lab specimen refrigerator R-2', 'appliance', 720, 30, {
      handleLock: true,
      notes: 'Lock-on clip fitted.',
    }),
    ckt(9, 1, 20, 'Lab 110 & break room 124 lights', 'lighting', 1000, 40),
    ckt(11, 1, 20, 'Break room 124 counter receptacles (GFCI)', 'receptacles', 720, 35, {
      breakerType: 'gfci',
    }),
    // deliberate problem 1: 20 A breaker on 14 AWG Cu
    ckt(13, 1, 20, 'Break room microwave', 'appliance', 1500, 35, {
      breakerType: 'gfci',
      conductorSize: '14',
    }),
    ckt(15, 1, 20, 'Break room refrigerator (GFCI)', 'appliance', 700, 35, { breakerType: 'gfci' }),
    ckt(17, 1, 20, 'Break room dishwasher (GFCI)', 'appliance', 1200, 35, { breakerType: 'gfci' }),
    ckt(19, 1, 20, 'Staff restroom 3 & lockers receptacles (GFCI)', 'receptacles', 360, 40, {
      breakerType: 'gfci',
    }),
    ckt(21, 2, 30, 'Eyewash tempering water heater EWH-1', 'appliance', 4500, 25, {
      continuous: true,
    }),
    spare(25, 20),
    // right column
    ckt(2, 1, 20, 'Offices 126 & 127 receptacles', 'receptacles', 720, 45),
    ckt(4, 1, 20, 'Offices 126 & 127 lights', 'lighting', 600, 45),
    ckt(6, 1, 20, 'Medical records 128 receptacles', 'receptacles', 540, 40),
    ckt(8, 1, 20, 'Medical records 128 lights', 'lighting', 400, 40),
    ckt(10, 2, 20, 'Ductless split MS-2, Lab 110', 'hvac', 2400, 50, { continuous: true }),
    ckt(14, 3, 15, 'Lab fume hood exhaust fan EF-4', 'motor', 1500, 60, { continuous: true }),
    spare(20, 20),
    spare(22, 15),
  ],
);

// ---------------------------------------------------------------------------------------------
// Copperwick Lofts
// ---------------------------------------------------------------------------------------------

const loftsMSB = panel(
  {
    key: 'lofts-MSB',
    tag: 'MSB',
    location: 'Main electrical room B02, basement',
    kind: 'switchboard',
    system: '480Y/277V-3ph-4w',
    busRatingA: 800,
    mainRatingA: 800,
    shortCircuitKA: 65,
    terminationTempC: 75,
    spaces: 30,
    fedFromPanelKey: null,
    fedFromPosition: null,
    maker: 'Front-accessible switchboard, group-mounted MCCBs',
    model: '800 A main, 480Y/277 V, 65 kA',
    installedOn: '2016-09-20',
    condition: 2,
  },
  [
    feeder(1, 3, 175, 'Transformer T-1 (112.5 kVA, 480–208Y/120 V) → DP-1', 'lofts-DP1', 25, {
      notes: 'Primary conductors to T-1 in B02; T-1 secondary to DP-1 main breaker.',
    }),
    ckt(2, 3, 40, 'Make-up air unit MAU-1 (corridors)', 'hvac', 20000, 160, { continuous: true }),
    feeder(7, 3, 100, 'Panel H1 (277 V house lighting & mechanical)', 'lofts-H1', 15),
    ckt(8, 3, 20, 'Domestic water booster pump P-1', 'motor', 6000, 30),
    ckt(13, 3, 60, 'Elevator EL-1 machine (shunt trip)', 'motor', 24000, 150, {
      breakerType: 'shunt-trip',
      notes: 'Shunt trip from machine-room heat detector (NEC 620.51(B)).',
    }),
    ckt(14, 3, 30, 'Shop A rooftop unit RTU-A', 'hvac', 12000, 90, { continuous: true }),
    spare(19, 100, 3),
    ckt(20, 3, 25, 'Shop B rooftop unit RTU-B', 'hvac', 10000, 95, { continuous: true }),
    ckt(25, 3, 30, 'Surge protective device SPD-M', 'other', 0, 4, { breakerType: 'surge' }),
  ],
);

const loftsH1 = panel(
  {
    key: 'lofts-H1',
    tag: 'H1',
    location: 'Main electrical room B02, east wall',
    kind: 'panelboard',
    system: '480Y/277V-3ph-4w',
    busRatingA: 100,
    mainRatingA: null,
    shortCircuitKA: 65,
    terminationTempC: 75,
    spaces: 30,
    fedFromPanelKey: 'lofts-MSB',
    fedFromPosition: 7,
    maker: '277/480 V lighting panelboard, bolt-on',
    model: '100 A main lugs, 30 sp',
    installedOn: '2016-09-20',
    condition: 2,
  },
  [
    // left column — 277 V lighting
    ckt(1, 1, 20, 'Corridor lights level 1', 'lighting', 1600, 90),
    ckt(3, 1, 20, 'Corridor lights level 2', 'lighting', 1600, 110),
    ckt(5, 1, 20, 'Corridor lights level 3', 'lighting', 1600, 130),
    ckt(7, 1, 20, 'Corridor lights level 4', 'lighting', 1600, 150),
    ckt(9, 1, 20, 'Stair S-1 lights, all levels', 'lighting', 800, 140),
    ckt(11, 1, 20, 'Stair S-2 lights, all levels', 'lighting', 800, 160),
    ckt(13, 1, 20, 'Parking court pole lights P1–P4', 'lighting', 1800, 180),
    ckt(15, 1, 20, 'Façade & entry canopy lights', 'lighting', 1200, 100),
    ckt(17, 1, 20, 'Basement storage & bike room lights', 'lighting', 900, 60),
    ckt(19, 1, 20, 'Refuse room & room B02 lights', 'lighting', 500, 40),
    ckt(21, 1, 20, 'Emergency lighting inverter EI-1', 'lighting', 2000, 30, {
      handleLock: true,
      notes: 'Lock-on clip fitted; inverter feeds corridor and stair emergency fixtures.',
    }),
    spare(23, 20),
    // right column — 480 V equipment
    ckt(2, 3, 15, 'Unit heater UH-1, boiler room B03', 'hvac', 5000, 35, { continuous: true }),
    ckt(8, 3, 15, 'Heating circulating pumps P-2 & P-3', 'motor', 3000, 40, { continuous: true }),
    ckt(14, 3, 15, 'Corridor exhaust fan EF-5 (roof)', 'motor', 2500, 150, { continuous: true }),
    ckt(20, 3, 30, 'Duct heater DH-1 (MAU-1 reheat)', 'hvac', 18000, 150, { continuous: true }),
    spare(26, 20),
  ],
);

const loftsDP1 = panel(
  {
    key: 'lofts-DP1',
    tag: 'DP-1',
    location: 'Main electrical room B02, beside transformer T-1',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 400,
    mainRatingA: 400,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 30,
    fedFromPanelKey: 'lofts-MSB',
    fedFromPosition: 1,
    maker: 'Distribution panelboard, bolt-on MCCBs',
    model: '400 A main breaker, 30 sp',
    installedOn: '2016-09-20',
    condition: 2,
  },
  [
    feeder(1, 3, 125, 'Panel 1LA (Shop A café) feeder', 'lofts-1LA', 60),
    ckt(2, 2, 30, 'Laundry dryer D-1, common laundry 003', 'appliance', 5000, 55),
    ckt(6, 2, 30, 'Laundry dryer D-2, common laundry 003', 'appliance', 5000, 55),
    feeder(7, 3, 100, 'Panel 1LB (Shop B salon) feeder', 'lofts-1LB', 80),
    ckt(10, 2, 30, 'Laundry dryer D-3, common laundry 003', 'appliance', 5000, 55),
    feeder(13, 3, 100, 'Panel HP (house common areas) feeder', 'lofts-HP', 30),
    spare(14, 70, 3),
    ckt(19, 3, 30, 'Walk-in cooler condensing unit CU-A1 (Shop A)', 'motor', 7500, 70, {
      continuous: true,
    }),
    ckt(25, 3, 30, 'Surge protective device SPD-2', 'other', 0, 3, { breakerType: 'surge' }),
  ],
);

const lofts1LA = panel(
  {
    key: 'lofts-1LA',
    tag: '1LA',
    location: 'Shop A back-of-house, beside rear door',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 125,
    mainRatingA: 125,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 42,
    fedFromPanelKey: 'lofts-DP1',
    fedFromPosition: 1,
    maker: 'Bolt-on panelboard, 42 sp',
    model: '125 A main breaker, 3φ 4W',
    installedOn: '2016-09-20',
    condition: 3,
  },
  [
    // left column
    ckt(1, 2, 30, 'Espresso machine (2-pole, GFCI)', 'appliance', 5400, 25, { breakerType: 'gfci' }),
    ckt(5, 1, 20, 'Front counter receptacles (GFCI)', 'receptacles', 720, 35, { breakerType: 'gfci' }),
    ckt(7, 1, 20, 'Back counter receptacles (GFCI)', 'receptacles', 720, 40, { breakerType: 'gfci' }),
    ckt(9, 1, 20, 'Reach-in refrigerator RF-1 (GFCI)', 'appliance', 840, 30, { breakerType: 'gfci' }),
    ckt(11, 1, 20, 'Pastry display case DC-1 (GFCI)', 'appliance', 1000, 20, { breakerType: 'gfci' }),
    ckt(13, 3, 30, 'Dishwasher DW-1 booster heater', 'appliance', 7200, 30, { continuous: true }),
    ckt(19, 1, 20, 'Dishwasher DW-1 wash pump & controls (GFCI)', 'appliance', 1200, 30, {
      breakerType: 'gfci',
    }),
    ckt(21, 1, 20, 'Sales floor lights', 'lighting', 1400, 50),
    ckt(23, 1, 20, 'Kitchen lights', 'lighting', 900, 40),
    // deliberate problem 2: vague directory text
    ckt(25, 1, 20, 'misc', 'other', 500, 60),
    ckt(27, 1, 20, 'Storefront sign & window display lights', 'lighting', 600, 45),
    ckt(29, 1, 20, 'Grinder & blender station receptacles (GFCI)', 'appliance', 1200, 30, {
      breakerType: 'gfci',
    }),
    ckt(31, 1, 20, 'Seating area receptacles', 'receptacles', 540, 60),
    ckt(33, 1, 20, 'Restroom hand dryer HD-1', 'appliance', 1500, 45),
    ckt(35, 1, 20, 'POS terminals & network router', 'receptacles', 540, 30),
    spare(37, 20),
    spare(39, 20),
    // right column
    ckt(2, 3, 15, 'Hood exhaust fan KEF-1', 'motor', 2000, 50, { continuous: true }),
    ckt(8, 1, 20, 'Ice machine IM-1 (GFCI)', 'appliance', 1200, 25, { breakerType: 'gfci' }),
    ckt(10, 2, 40, 'Convection oven CO-1 (2-pole)', 'appliance', 6500, 25),
    ckt(14, 2, 30, 'Water heater WH-A (2-pole)', 'appliance', 4500, 20, { continuous: true }),
    ckt(18, 1, 20, 'Back-of-house receptacles (GFCI)', 'receptacles', 540, 35, { breakerType: 'gfci' }),
    ckt(20, 1, 20, 'Office & dry storage lights', 'lighting', 400, 40),
    ckt(22, 1, 20, 'Office receptacles', 'receptacles', 360, 45),
    ckt(24, 1, 20, 'Walk-in cooler evaporator EV-A1', 'motor', 600, 35, { continuous: true }),
    ckt(26, 1, 20, 'Restroom receptacle & exhaust fan (GFCI)', 'receptacles', 300, 45, {
      breakerType: 'gfci',
    }),
    ckt(28, 1, 20, 'Rear door exterior light', 'lighting', 300, 50),
    spare(30, 20),
  ],
);

const lofts1LB = panel(
  {
    key: 'lofts-1LB',
    tag: '1LB',
    location: 'Shop B storage closet',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 100,
    mainRatingA: 100,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 30,
    fedFromPanelKey: 'lofts-DP1',
    fedFromPosition: 7,
    maker: 'Bolt-on panelboard, 30 sp',
    model: '100 A main breaker, 3φ 4W',
    installedOn: '2016-09-20',
    condition: 2,
  },
  [
    // left column
    ckt(1, 1, 20, 'Styling stations 1–3 receptacles', 'receptacles', 1440, 35),
    ckt(3, 1, 20, 'Styling stations 4–6 receptacles', 'receptacles', 1440, 40),
    ckt(5, 1, 20, 'Shampoo bowls receptacles (GFCI)', 'receptacles', 360, 30, { breakerType: 'gfci' }),
    ckt(7, 1, 20, 'Salon floor lights', 'lighting', 1200, 45),
    ckt(9, 1, 20, 'Retail display & window lights', 'lighting', 700, 50),
    ckt(11, 1, 20, 'Reception desk & POS receptacles', 'receptacles', 540, 30),
    ckt(13, 1, 20, 'Towel washer, laundry closet (GFCI)', 'appliance', 1200, 40, { breakerType: 'gfci' }),
    ckt(15, 2, 30, 'Towel dryer, laundry closet (2-pole)', 'appliance', 5000, 40),
    spare(19, 20),
    // right column
    ckt(2, 2, 30, 'Heat pump HP-B1 condenser (2-pole)', 'hvac', 4800, 60, { continuous: true }),
    ckt(6, 2, 20, 'Water heater WH-B (2-pole)', 'appliance', 3000, 20, { continuous: true }),
    ckt(10, 1, 20, 'Restroom receptacle & exhaust fan (GFCI)', 'receptacles', 300, 35, {
      breakerType: 'gfci',
    }),
    ckt(12, 1, 20, 'Back room lights', 'lighting', 500, 30),
    ckt(14, 1, 20, 'Storefront sign (NEC 600.5 sign circuit)', 'lighting', 400, 35),
    spare(16, 20),
  ],
);

const loftsHP = panel(
  {
    key: 'lofts-HP',
    tag: 'HP',
    location: 'Basement corridor B01, opposite laundry 003',
    kind: 'panelboard',
    system: '208Y/120V-3ph-4w',
    busRatingA: 125,
    mainRatingA: null,
    shortCircuitKA: 22,
    terminationTempC: 75,
    spaces: 42,
    fedFromPanelKey: 'lofts-DP1',
    fedFromPosition: 13,
    maker: 'Branch-circuit panelboard, bolt-on',
    model: '125 A main lugs, 42 sp',
    installedOn: '2016-09-20',
    condition: 2,
  },
  [
    // left column
    ckt(1, 1, 20, 'Laundry 003 receptacles (GFCI)', 'receptacles', 540, 30, { breakerType: 'gfci' }),
    ckt(3, 1, 20, 'Laundry washers W-1 & W-2 (GFCI)', 'appliance', 1200, 35, { breakerType: 'gfci' }),
    ckt(5, 1, 20, 'Laundry washer W-3 (GFCI)', 'appliance', 600, 35, { breakerType: 'gfci' }),
    ckt(7, 1, 15, 'Boiler B-1 burner & controls', 'hvac', 400, 40, {
      continuous: true,
      handleLock: true,
    }),
    ckt(9, 1, 15, 'Boiler B-2 burner & controls', 'hvac', 400, 40, {
      continuous: true,
      handleLock: true,
    }),
    ckt(11, 1, 20, 'Fire alarm control panel FACP', 'other', 400, 20, {
      handleLock: true,
      notes: 'Red handle marking and lock per NEC 760.41(B).',
    }),
    ckt(13, 1, 20, 'Intercom & door entry system', 'other', 300, 60),
    ckt(15, 1, 20, 'Elevator EL-1 car lights & fan', 'lighting', 400, 150, {
      notes: 'Car lighting branch circuit per NEC 620.22; disconnect in machine room.',
    }),
    ckt(17, 1, 15, 'Elevator pit light & receptacle (GFCI)', 'receptacles', 240, 150, {
      breakerType: 'gfci',
    }),
    ckt(19, 1, 20, 'Corridor receptacles levels 1–2', 'receptacles', 720, 120),
    ckt(21, 1, 20, 'Corridor receptacles levels 3–4', 'receptacles', 720, 160, {
      conductorSize: '10',
      notes: UPSIZED,
    }),
    ckt(23, 1, 20, 'Bike room & storage receptacles', 'receptacles', 360, 50),
    ckt(25, 1, 20, 'Lobby & mailroom receptacles', 'receptacles', 540, 40),
    ckt(27, 1, 20, 'Lobby lights', 'lighting', 900, 45),
    ckt(29, 1, 20, 'Roof service receptacles (GFCI, WR)', 'receptacles', 360, 150, {
      breakerType: 'gfci',
    }),
    ckt(31, 1, 20, 'Sump pump SP-1, basement (GFCI)', 'motor', 1180, 60, {
      breakerType: 'gfci',
      handleLock: true,
    }),
    ckt(33, 1, 20, 'CCTV recorder & cameras', 'other', 480, 70),
    spare(35, 20),
    spare(37, 20),
    // right column
    ckt(2, 1, 15, 'Dryer exhaust booster fan DBF-1', 'motor', 300, 40, { continuous: true }),
    ckt(4, 1, 15, 'Hot water recirculation pump P-4', 'motor', 250, 45, { continuous: true }),
    ckt(6, 1, 20, 'Roof drain heat trace (GFPE)', 'other', 1200, 110, {
      breakerType: 'other',
      continuous: true,
      conductorSize: '10',
      notes: `30 mA equipment ground-fault protection (NEC 426.28). ${UPSIZED}`,
    }),
    ckt(8, 1, 20, 'Refuse room receptacles & exhaust fan EF-6', 'receptacles', 540, 45),
    ckt(10, 2, 20, 'Unit heater UH-2, refuse room', 'hvac', 3000, 50, { continuous: true }),
    ckt(14, 1, 20, 'Elevator machine room light & receptacle', 'receptacles', 360, 150),
    ckt(16, 1, 20, 'Façade receptacles (GFCI, WR)', 'receptacles', 360, 90, { breakerType: 'gfci' }),
    ckt(18, 1, 20, 'Parking court gate operator', 'motor', 800, 170, {
      conductorSize: '10',
      notes: UPSIZED,
    }),
    ckt(20, 1, 20, 'Boiler room B03 receptacles (GFCI)', 'receptacles', 360, 40, { breakerType: 'gfci' }),
    ckt(22, 1, 15, 'Water softener & booster pump controls', 'other', 200, 30),
    spare(24, 20),
  ],
);

// ---------------------------------------------------------------------------------------------
// Wrenfold Cottage
// ---------------------------------------------------------------------------------------------

const cottageLC1 = panel(
  {
    key: 'cottage-LC1',
    tag: 'LC-1',
    location: 'Utility room, beside back door',
    kind: 'load-centre',
    system: '120/240V-1ph-3w',
    busRatingA: 200,
    mainRatingA: 200,
    shortCircuitKA: 10,
    // an older load centre whose label was not read at the survey: 110.14(C)(1)(a) takes 60 °C
    terminationTempC: null,
    spaces: 30,
    fedFromPanelKey: null,
    fedFromPosition: null,
    maker: 'Plug-on residential load centre, 30 sp',
    model: '200 A main breaker, 120/240 V',
    installedOn: '2007-04-11',
    condition: 2,
  },
  [
    // left column
    ckt(1, 2, 50, 'Range (2-pole)', 'appliance', 8000, 35, {
      conductorSize: '8',
      notes: '8 AWG copper cable, run when the range was changed.',
    }),
    ckt(5, 1, 20, 'Kitchen counter receptacles left (dual function)', 'receptacles', 1500, 30, {
      breakerType: 'dual-function',
    }),
    ckt(7, 1, 20, 'Kitchen counter receptacles right (dual function)', 'receptacles', 1500, 30, {
      breakerType: 'dual-function',
    }),
    ckt(9, 1, 20, 'Dishwasher (dual function)', 'appliance', 1200, 25, { breakerType: 'dual-function' }),
    ckt(11, 1, 20, 'Refrigerator (dual function)', 'appliance', 700, 20, { breakerType: 'dual-function' }),
    ckt(13, 1, 20, 'Microwave / range hood (AFCI)', 'appliance', 1500, 30, { breakerType: 'afci' }),
    ckt(15, 1, 15, 'Bedroom 1 receptacles & lights (AFCI)', 'receptacles', 900, 60, { breakerType: 'afci' }),
    ckt(17, 1, 15, 'Bedroom 2 receptacles & lights (AFCI)', 'receptacles', 900, 65, { breakerType: 'afci' }),
    ckt(19, 1, 20, 'Bathroom receptacles (GFCI)', 'receptacles', 1500, 40, { breakerType: 'gfci' }),
    ckt(21, 1, 15, 'Living room receptacles (AFCI)', 'receptacles', 720, 45, { breakerType: 'afci' }),
    ckt(23, 1, 15, 'Hall, stair & landing lights (AFCI)', 'lighting', 400, 50, { breakerType: 'afci' }),
    spare(25, 15),
    // right column
    ckt(2, 2, 30, 'Clothes dryer (2-pole, GFCI)', 'appliance', 5000, 30, { breakerType: 'gfci' }),
    ckt(6, 2, 30, 'Water heater (2-pole)', 'appliance', 4500, 20, { continuous: true }),
    ckt(10, 2, 30, 'Heat pump condenser HP-1 (2-pole)', 'hvac', 4200, 30, { continuous: true }),
    ckt(14, 2, 40, 'Air handler AH-1 & strip heat (2-pole)', 'hvac', 7200, 25, { continuous: true }),
    ckt(18, 1, 20, 'Laundry washer receptacle (GFCI)', 'appliance', 1200, 30, { breakerType: 'gfci' }),
    ckt(20, 1, 15, 'Bathroom lights & exhaust fan', 'lighting', 300, 40),
    ckt(22, 1, 20, 'Exterior receptacles front & rear (GFCI)', 'receptacles', 360, 55, {
      breakerType: 'gfci',
    }),
    feeder(24, 2, 60, 'Garage sub-panel GP (detached garage)', 'cottage-GP', 70, {
      conductorSize: '4',
      conductorMaterial: 'Al',
      notes: 'Aluminium feeder in underground PVC conduit.',
    }),
    ckt(28, 1, 15, 'Smoke & CO alarms, interconnected (AFCI)', 'other', 60, 45, { breakerType: 'afci' }),
    spare(30, 20),
  ],
);

const cottageGP = panel(
  {
    key: 'cottage-GP',
    tag: 'GP',
    location: 'Detached garage workshop, north wall',
    kind: 'load-centre',
    system: '120/240V-1ph-3w',
    busRatingA: 100,
    mainRatingA: 60,
    shortCircuitKA: 10,
    terminationTempC: 75,
    spaces: 12,
    fedFromPanelKey: 'cottage-LC1',
    fedFromPosition: 24,
    maker: 'Plug-on load centre, 12 sp',
    model: '100 A bus, 60 A main (building disconnect)',
    installedOn: '2018-05-03',
    condition: 1,
  },
  [
    ckt(1, 1, 20, 'Garage door opener (GFCI)', 'motor', 600, 20, { breakerType: 'gfci' }),
    ckt(2, 2, 30, 'EV charging outlet, 24 A charger (2-pole, GFCI)', 'other', 5760, 20, {
      breakerType: 'gfci',
      continuous: true,
    }),
    ckt(3, 1, 20, 'Workbench receptacles (GFCI)', 'receptacles', 1080, 25, { breakerType: 'gfci' }),
    ckt(5, 1, 15, 'Garage lights & exterior floodlights', 'lighting', 500, 40),
    ckt(6, 2, 20, 'Wall heater (2-pole)', 'hvac', 2000, 15, { continuous: true }),
    ckt(7, 2, 20, 'Table saw & air compressor receptacle, 240 V (GFCI)', 'motor', 2400, 15, {
      breakerType: 'gfci',
    }),
    spare(10, 20),
  ],
);

// ---------------------------------------------------------------------------------------------
// The scenario
// ---------------------------------------------------------------------------------------------

export const DEMO_ORGANISATION: { name: string } = { name: 'Tallowmere Electrical Services' };

export const DEMO_BUILDINGS: DemoBuilding[] = [
  {
    key: 'clinic',
    name: 'Brackenfold Family Clinic',
    address: '418 Sorrelgate Road, Eastmoor Heights',
    notes:
      'Single-storey clinic: 8 exam rooms, imaging room 112, lab and staff wing (2019 remodel). ' +
      '208Y/120 V 400 A service from the utility pad-mount transformer.',
    panels: [clinicMDP, clinicLA, clinicLB],
  },
  {
    key: 'lofts',
    name: 'Copperwick Lofts',
    address: '27–33 Saltgrass Lane, Eastmoor Heights',
    notes:
      'Four storeys: Shop A (café) and Shop B (salon) at ground level, 12 flats on levels 2–4. ' +
      '480Y/277 V 800 A service; transformer T-1 (112.5 kVA) steps down to 208Y/120 V for DP-1. ' +
      'Flat load centres are not yet in this register.',
    panels: [loftsMSB, loftsH1, loftsDP1, lofts1LA, lofts1LB, loftsHP],
  },
  {
    key: 'cottage',
    name: 'Wrenfold Cottage',
    address: '6 Thistledown Close, Eastmoor Heights',
    notes:
      "Two-bedroom caretaker's house with a detached garage workshop. 120/240 V 200 A service; " +
      'the connected load is above 200 A but the NEC 220.82 calculated load is well within it.',
    panels: [cottageLC1, cottageGP],
  },
];

// Feeder loadVA = the connected load of the panel it feeds (recursively), so a parent's total
// includes its sub-panels exactly once.
(function fillFeederLoads(): void {
  const byKey = new Map(DEMO_BUILDINGS.flatMap((b) => b.panels).map((p) => [p.key, p]));
  const memo = new Map<string, number>();
  const connected = (key: string): number => {
    const known = memo.get(key);
    if (known !== undefined) return known;
    const p = byKey.get(key);
    if (!p) throw new Error(`demo-data: unknown panel ${key}`);
    let total = 0;
    for (const c of p.circuits) {
      if (c.status !== 'in-use') continue;
      if (c.feedsPanelKey) c.loadVA = connected(c.feedsPanelKey);
      total += c.loadVA ?? 0;
    }
    memo.set(key, total);
    return total;
  };
  for (const key of byKey.keys()) connected(key);
})();

/** The building granted to the owner demo user. */
export const DEMO_OWNER_BUILDING_KEY = 'clinic';

export const DEMO_USERS: {
  email: string;
  name: string;
  role: 'admin' | 'electrician' | 'inspector' | 'owner';
}[] = [
  { email: 'admin@ampwright.test', name: 'Rowena Quillfeather', role: 'admin' },
  { email: 'electrician@ampwright.test', name: 'Idris Hallowmere', role: 'electrician' },
  { email: 'inspector@ampwright.test', name: 'Marisol Fenwright', role: 'inspector' },
  { email: 'owner@ampwright.test', name: 'Tobias Ashcombe', role: 'owner' },
];

export const DEMO_PASSWORD = 'ampwright-demo';

/**
 * The demo's condition record (invented): at the clinic, the autoclave circuit LA 28 has tripped
 * three times this autumn at about half its rating; the November thermal survey found its load
 * lug hot and the torque audit found the terminal loose. Plus a stale directory entry found on the
 * visual check and a filler plate the owner chose to defer. A survey a year earlier found the same
 * lug barely warm (so its rise across surveys deviates), and a trip test after the re-torque shows
 * the breaker itself clears in time, on an invented demo band. Dates are relative to the seed day.
 */
export interface DemoRecord {
  buildingKey: string;
  panelKey: string;
  /** the organisation's band library: invented bands, labelled so, never a maker's curve */
  bands: {
    key: string;
    label: string;
    ratingA: number;
    source: string;
    points: { multiple: number; minS: number; maxS: number }[];
    instantaneousMultiple: number | null;
    instantaneousTolerancePct: number | null;
  }[];
  inspections: {
    key: string;
    kind: 'thermal-survey' | 'torque-audit' | 'trip-test' | 'visual';
    by: 'inspector' | 'electrician';
    daysAgo: number;
    ambientC: number | null;
    loadPct: number | null;
    notes: string;
    signed: boolean;
  }[];
  /** `bandKey` names a band of `bands` the reading is judged against */
  readings: ({ inspectionKey: string; key: string; position: number | null; bandKey?: string } & Record<string, unknown>)[];
  trips: { position: number; daysAgo: number; hour: number; loadA: number | null; circumstances: string }[];
  deficiencies: {
    title: string;
    description: string;
    priority: 1 | 2 | 3 | 4;
    position: number | null;
    panelKey?: string;
    readingKey?: string;
    inspectionKey?: string;
    source: 'reading' | 'checklist' | 'manual';
    check?: string;
    status: 'open' | 'scheduled' | 'deferred';
    assignTo?: 'electrician';
    deferReason?: string;
    reviewInDays?: number;
  }[];
}

const DEMO_BAND_SOURCE =
  'DEMO: invented for the demonstration, shaped like a small thermal-magnetic breaker. Not a maker\u2019s curve: ' +
  'read a real band off the maker\u2019s published time-current curve.';

/**
 * The autoclave's load during the survey: 11 A of its normal 12.5 A. The survey's "% of normal",
 * the hot-lug reading and the finding's words all come from these two figures.
 */
const SURVEY_LOAD_A = 11;
const SURVEY_NORMAL_A = 12.5;
const SURVEY_LOAD_PCT = percentOfNormal(SURVEY_LOAD_A, SURVEY_NORMAL_A);

export const DEMO_RECORD: DemoRecord = {
  buildingKey: 'clinic',
  panelKey: 'clinic-LA',
  bands: [
    {
      key: 'demo-20',
      label: 'Demo 20 A thermal-magnetic (invented)',
      ratingA: 20,
      source: DEMO_BAND_SOURCE,
      points: [
        { multiple: 1.35, minS: 50, maxS: 1800 },
        { multiple: 2, minS: 12, maxS: 150 },
        { multiple: 3, minS: 5, maxS: 60 },
        { multiple: 5, minS: 1.8, maxS: 20 },
        { multiple: 7, minS: 1, maxS: 10 },
      ],
      instantaneousMultiple: 10,
      instantaneousTolerancePct: 25,
    },
    {
      key: 'demo-50',
      label: 'Demo 50 A thermal-magnetic (invented)',
      ratingA: 50,
      source: DEMO_BAND_SOURCE,
      points: [
        { multiple: 1.35, minS: 80, maxS: 3000 },
        { multiple: 2, minS: 20, maxS: 250 },
        { multiple: 3, minS: 8, maxS: 90 },
        { multiple: 5, minS: 3, maxS: 30 },
        { multiple: 7, minS: 1.6, maxS: 15 },
      ],
      instantaneousMultiple: 10,
      instantaneousTolerancePct: 25,
    },
  ],
  inspections: [
    {
      key: 'last-year',
      kind: 'thermal-survey',
      by: 'inspector',
      daysAgo: 385,
      ambientC: 22,
      loadPct: 60,
      notes: 'Annual scan of LA and LB, dead-front off, clinic open.',
      signed: true,
    },
    {
      key: 'survey',
      kind: 'thermal-survey',
      by: 'inspector',
      daysAgo: 20,
      ambientC: 23,
      loadPct: SURVEY_LOAD_PCT,
      notes: 'Dead-front off, clinic open, autoclave cycling. Scanned LA and LB.',
      signed: true,
    },
    {
      key: 'torque',
      kind: 'torque-audit',
      by: 'electrician',
      daysAgo: 18,
      ambientC: null,
      loadPct: null,
      notes: 'Checked LA 28 after the survey, de-energised.',
      signed: false,
    },
    {
      key: 'trip-test',
      kind: 'trip-test',
      by: 'electrician',
      daysAgo: 17,
      ambientC: null,
      loadPct: null,
      notes: 'LA 28 breaker out of service, primary injection after the re-torque.',
      signed: false,
    },
  ],
  readings: [
    {
      inspectionKey: 'last-year',
      key: 'lug-last-year',
      position: 28,
      kind: 'thermal',
      component: 'lug',
      phase: 'B',
      temperatureC: 39,
      referenceC: 36,
      referenceBasis: 'similar',
      notes: 'Load lug of LA 28 against LA 22 beside it.',
    },
    {
      inspectionKey: 'survey',
      key: 'hot-lug',
      position: 28,
      kind: 'thermal',
      component: 'lug',
      phase: 'B',
      temperatureC: 58,
      referenceC: 36,
      referenceBasis: 'similar',
      loadA: SURVEY_LOAD_A,
      referenceLoadA: SURVEY_NORMAL_A,
      notes: 'Load lug of LA 28 against LA 22 beside it.',
    },
    {
      inspectionKey: 'survey',
      key: 'bus',
      position: null,
      kind: 'thermal',
      component: 'bus',
      phase: 'A',
      temperatureC: 31,
      referenceC: 29,
      referenceBasis: 'similar',
      notes: 'Bus stab, phase A vs phase C.',
    },
    {
      inspectionKey: 'torque',
      key: 'loose',
      position: 28,
      kind: 'torque',
      fastener: 'breaker load terminal',
      specified: 35,
      unit: 'lbf-in',
      specSource: 'fallback-table',
      conductorSize: '10',
      screw: 'slotted-large',
      asFound: 'turned',
      asFoundValue: 15,
      asLeft: 35,
      notes: 'No maker value on the label; UL 486A-B table used.',
    },
    {
      inspectionKey: 'trip-test',
      key: 'trip-300',
      position: 28,
      kind: 'trip',
      bandKey: 'demo-20',
      testCurrentA: 60,
      tripped: true,
      tripTimeS: 14,
      notes: '300 % of rating; cleared within the band. The low-load trips point to the lug, not the breaker.',
    },
  ],
  trips: [
    { position: 28, daysAgo: 35, hour: 8, loadA: 7, circumstances: 'Autoclave warming up for the first load' },
    { position: 28, daysAgo: 27, hour: 13, loadA: 6.5, circumstances: 'Mid-cycle, nothing else on' },
    { position: 28, daysAgo: 22, hour: 9, loadA: null, circumstances: 'Found tripped in the morning' },
  ],
  deficiencies: [
    {
      title: 'Hot load lug, LA 28 (autoclave)',
      description: `ΔT 22 °C over the neighbouring lug at ${SURVEY_LOAD_PCT} % of normal load.`,
      priority: 1,
      position: 28,
      readingKey: 'hot-lug',
      inspectionKey: 'survey',
      source: 'reading',
      status: 'scheduled',
      assignTo: 'electrician',
    },
    {
      title: 'Directory names a person, not a room (LA 27)',
      description: 'Rename to the room served.',
      priority: 3,
      position: 27,
      inspectionKey: 'survey',
      source: 'checklist',
      check: 'directory-missing',
      status: 'open',
    },
    {
      title: 'Missing filler plate, panel LB',
      description: 'One open space in the dead-front, bottom right.',
      priority: 2,
      position: null,
      panelKey: 'clinic-LB',
      source: 'manual',
      status: 'deferred',
      deferReason: 'Panel LB is being replaced in the spring renovation',
      reviewInDays: 60,
    },
  ],
};
