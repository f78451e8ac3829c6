import { describe, it } from 'node:test';
import { panelFaultCheck } from '../../shared/panel-checks';
import assert from 'node:assert/strict';

import {
  DEMO_BUILDINGS,
  DEMO_ORGANISATION,
  DEMO_OWNER_BUILDING_KEY,
  DEMO_PASSWORD,
  DEMO_RECORD,
  DEMO_USERS,
  type DemoCircuit,
  type DemoPanel,
} from '../../scripts/demo-data';
import { percentOfNormal } from '../../shared/calc/thermal';
import {
  BREAKER_TYPES,
  CIRCUIT_STATUSES,
  CONDUCTOR_SIZES,
  LOAD_KINDS,
  PANEL_KINDS,
  ROLES,
  SYSTEM_INFO,
  type ConductorSize,
} from '../../shared/domain';
import { circuitWarnings } from '../../shared/calc';

const panels: DemoPanel[] = DEMO_BUILDINGS.flatMap((b) => b.panels);
const circuits: { panel: DemoPanel; c: DemoCircuit }[] = panels.flatMap((panel) =>
  panel.circuits.map((c) => ({ panel, c })),
);
const label = (p: DemoPanel, c: DemoCircuit) => `${p.key} pos ${c.position} "${c.description}"`;

/** n, n+2, n+4 … computed here independently of the data file. */
function occupied(c: DemoCircuit): number[] {
  const out: number[] = [];
  for (let i = 0; i < c.poles; i++) out.push(c.position + 2 * i);
  return out;
}

// Sanity tables used only to prove the deliberate problems are the ONLY problems.
// NEC Table 310.16, 75 °C column.
const AMPACITY_75: Record<'Cu' | 'Al', Partial<Record<ConductorSize, number>>> = {
  Cu: {
    '14': 20, '12': 25, '10': 35, '8': 50, '6': 65, '4': 85, '3': 100, '2': 115, '1': 130,
    '1/0': 150, '2/0': 175, '3/0': 200, '4/0': 230, '250': 255, '300': 285, '350': 310,
    '400': 335, '500': 380,
  },
  Al: {
    '12': 20, '10': 30, '8': 40, '6': 50, '4': 65, '3': 75, '2': 90, '1': 100, '1/0': 120,
    '2/0': 135, '3/0': 155, '4/0': 180, '250': 205, '300': 230, '350': 250, '400': 270, '500': 310,
  },
};
// NEC Table 310.16, 60 °C column (the sizes the demo uses), for terminations not recorded:
// NEC 110.14(C)(1)(a) takes 60 °C for circuits of 100 A or less.
const AMPACITY_60: Record<'Cu' | 'Al', Partial<Record<ConductorSize, number>>> = {
  Cu: { '14': 15, '12': 20, '10': 30, '8': 40, '6': 55, '4': 70, '3': 85, '2': 95, '1': 110 },
  Al: { '12': 15, '10': 25, '8': 35, '6': 40, '4': 55, '3': 65, '2': 75, '1': 85 },
};
// NEC 240.4(D) small-conductor limits.
const SMALL_LIMIT: Record<'Cu' | 'Al', Partial<Record<ConductorSize, number>>> = {
  Cu: { '14': 15, '12': 20, '10': 30 },
  Al: { '12': 15, '10': 25 },
};
// NEC Chapter 9 Table 8, stranded uncoated copper / aluminium, Ω per 1000 ft (DC, 75 °C).
const OHMS_PER_KFT: Record<'Cu' | 'Al', Partial<Record<ConductorSize, number>>> = {
  Cu: {
    '14': 3.14, '12': 1.98, '10': 1.24, '8': 0.778, '6': 0.491, '4': 0.308, '3': 0.245,
    '2': 0.194, '1': 0.154, '1/0': 0.122, '2/0': 0.0967, '3/0': 0.0766, '4/0': 0.0608,
    '250': 0.0515, '300': 0.0429, '350': 0.0367, '400': 0.0321, '500': 0.0258,
  },
  Al: {
    '12': 3.25, '10': 2.04, '8': 1.28, '6': 0.808, '4': 0.508, '3': 0.403, '2': 0.319,
    '1': 0.253, '1/0': 0.201, '2/0': 0.159, '3/0': 0.126, '4/0': 0.1, '250': 0.0847,
    '300': 0.0707, '350': 0.0605, '400': 0.0529, '500': 0.0424,
  },
};

// NEC 240.6(A) standard ratings (to 800 A).
const STANDARD_RATINGS = [
  15, 20, 25, 30, 35, 40, 45, 50, 60, 70, 80, 90, 100, 110, 125, 150, 175, 200, 225, 250, 300, 350,
  400, 450, 500, 600, 700, 800,
];
const nextStandardRating = (a: number) => STANDARD_RATINGS.find((r) => r >= a) ?? a;

function circuitVoltage(p: DemoPanel, c: DemoCircuit): number {
  const info = SYSTEM_INFO[p.system];
  return c.poles === 1 ? (info.neutralV ?? info.lineV) : info.lineV;
}
function circuitAmps(p: DemoPanel, c: DemoCircuit): number {
  const v = circuitVoltage(p, c);
  const va = c.loadVA ?? 0;
  return c.poles === 3 ? va / (Math.sqrt(3) * v) : va / v;
}
function voltageDropPct(p: DemoPanel, c: DemoCircuit): number | null {
  if (!c.conductorSize || !c.conductorMaterial || c.lengthFt == null || !c.loadVA) return null;
  const r = OHMS_PER_KFT[c.conductorMaterial][c.conductorSize];
  if (r == null) return null;
  const k = c.poles === 3 ? Math.sqrt(3) : 2;
  const vd = (k * c.lengthFt * r * circuitAmps(p, c)) / 1000;
  return (100 * vd) / circuitVoltage(p, c);
}

describe('demo scenario', () => {
  it('has the organisation, buildings, panels and circuits the demo needs', () => {
    assert.ok(DEMO_ORGANISATION.name.length > 0);
    assert.ok(DEMO_BUILDINGS.length >= 2, 'at least 2 buildings');
    assert.ok(panels.length >= 6, 'at least 6 panels');
    assert.ok(circuits.length >= 150, `at least 150 circuits (have ${circuits.length})`);
    const inUseOrSpare = circuits.filter(({ c }) => c.status !== 'space').length;
    assert.ok(inUseOrSpare >= 150, `at least 150 breakers (have ${inUseOrSpare})`);
    const systems = new Set(panels.map((p) => p.system));
    assert.ok(systems.size >= 3, 'at least 3 distinct systems');
    for (const s of ['120/240V-1ph-3w', '208Y/120V-3ph-4w', '480Y/277V-3ph-4w'] as const) {
      assert.ok(systems.has(s), `has a ${s} panel`);
    }
    assert.ok(panels.filter((p) => p.system === '208Y/120V-3ph-4w').length >= 3);
  });

  it('uses unique keys and the shared vocabulary', () => {
    const bKeys = DEMO_BUILDINGS.map((b) => b.key);
    assert.equal(new Set(bKeys).size, bKeys.length);
    const pKeys = panels.map((p) => p.key);
    assert.equal(new Set(pKeys).size, pKeys.length);
    assert.ok(bKeys.includes(DEMO_OWNER_BUILDING_KEY));
    for (const p of panels) {
      assert.ok(p.system in SYSTEM_INFO, p.key);
      assert.ok((PANEL_KINDS as readonly string[]).includes(p.kind), p.key);
      assert.match(p.installedOn, /^\d{4}-\d{2}-\d{2}$/);
      assert.ok(!Number.isNaN(Date.parse(p.installedOn)), p.key);
      assert.ok([1, 2, 3].includes(p.condition));
      if (p.kind !== 'switchboard') {
        assert.ok(p.spaces >= 12 && p.spaces <= 42 && p.spaces % 2 === 0, `${p.key} spaces`);
      }
      if (p.mainRatingA != null) assert.ok(p.mainRatingA <= p.busRatingA, `${p.key} main ≤ bus`);
    }
    for (const { panel, c } of circuits) {
      const l = label(panel, c);
      assert.ok((BREAKER_TYPES as readonly string[]).includes(c.breakerType), l);
      assert.ok((LOAD_KINDS as readonly string[]).includes(c.loadKind), l);
      assert.ok((CIRCUIT_STATUSES as readonly string[]).includes(c.status), l);
      if (c.conductorSize) assert.ok((CONDUCTOR_SIZES as readonly string[]).includes(c.conductorSize), l);
      if (c.status === 'space') {
        assert.equal(c.ratingA, null, l);
        assert.equal(c.poles, 1, l);
        assert.equal(c.description, '', l);
      } else {
        assert.ok(c.ratingA != null && c.ratingA > 0, l);
      }
      if (c.status === 'spare') {
        assert.equal(c.description, 'Spare', l);
        assert.equal(c.loadVA, null, l);
      }
    }
  });

  it('has a valid, full layout on every panel', () => {
    for (const p of panels) {
      const seen = new Map<number, DemoCircuit>();
      for (const c of p.circuits) {
        if (p.system === '120/240V-1ph-3w') assert.notEqual(c.poles, 3, `${label(p, c)}: 3-pole on 1φ`);
        for (const pos of occupied(c)) {
          assert.ok(pos >= 1 && pos <= p.spaces, `${label(p, c)} position ${pos} out of range`);
          const other = seen.get(pos);
          assert.equal(other, undefined, `${p.key} position ${pos} taken twice`);
          seen.set(pos, c);
        }
      }
      for (let pos = 1; pos <= p.spaces; pos++) assert.ok(seen.has(pos), `${p.key} position ${pos} uncovered`);
    }
  });

  it('links every feeder to the panel it feeds, both ways', () => {
    const byKey = new Map(panels.map((p) => [p.key, p]));
    let feeders = 0;
    for (const { panel, c } of circuits) {
      if (c.feedsPanelKey === undefined) {
        assert.notEqual(c.loadKind, 'feeder', `${label(panel, c)} feeder without feedsPanelKey`);
        continue;
      }
      feeders++;
      assert.equal(c.loadKind, 'feeder', label(panel, c));
      assert.equal(c.status, 'in-use', label(panel, c));
      assert.ok(c.poles >= 2, label(panel, c));
      const child = byKey.get(c.feedsPanelKey);
      assert.ok(child, `${label(panel, c)} feeds unknown ${c.feedsPanelKey}`);
      assert.equal(child.fedFromPanelKey, panel.key);
      assert.equal(child.fedFromPosition, c.position);
    }
    for (const p of panels) {
      if (p.fedFromPanelKey === null) {
        assert.equal(p.fedFromPosition, null);
        continue;
      }
      const parent = byKey.get(p.fedFromPanelKey);
      assert.ok(parent, `${p.key} fed from unknown ${p.fedFromPanelKey}`);
      const f = parent.circuits.find((c) => c.position === p.fedFromPosition);
      assert.equal(f?.feedsPanelKey, p.key, `${p.key}: parent breaker does not point back`);
    }
    assert.ok(feeders >= 5);
    // a hierarchy at least three levels deep (MSB → DP-1 → 1LA)
    const depth = (p: DemoPanel): number => (p.fedFromPanelKey ? 1 + depth(byKey.get(p.fedFromPanelKey)!) : 0);
    assert.ok(Math.max(...panels.map(depth)) >= 2);
  });

  it('has GFCI/AFCI, multi-pole, spare, space and handle-lock circuits', () => {
    const count = (f: (c: DemoCircuit) => boolean) => circuits.filter(({ c }) => f(c)).length;
    assert.ok(count((c) => c.breakerType === 'gfci') >= 10);
    assert.ok(count((c) => c.breakerType === 'afci' || c.breakerType === 'dual-function') >= 5);
    assert.ok(count((c) => c.poles === 2 && c.status === 'in-use') >= 10);
    assert.ok(count((c) => c.poles === 3 && c.status === 'in-use') >= 10);
    assert.ok(count((c) => c.status === 'spare') >= 3);
    assert.ok(count((c) => c.status === 'space') >= 3);
    assert.ok(count((c) => c.handleLock) >= 3);
    assert.ok(count((c) => c.lengthFt != null) >= 100);
  });

  it('contains exactly the deliberate problems and no others', () => {
    const wrongConductor: string[] = [];
    const overloaded: string[] = [];
    const highDrop: string[] = [];
    for (const { panel, c } of circuits) {
      if (c.status !== 'in-use' || c.ratingA == null) continue;
      const l = label(panel, c);
      assert.ok(c.conductorSize && c.conductorMaterial && c.insulationTempC, `${l} conductor`);
      const sixty = (c.terminationTempC ?? panel.terminationTempC) === null && c.ratingA <= 100;
      const amp = (sixty ? AMPACITY_60 : AMPACITY_75)[c.conductorMaterial][c.conductorSize];
      assert.ok(amp, `${l} size in table`);
      const small = SMALL_LIMIT[c.conductorMaterial][c.conductorSize];
      // 240.4(D) caps small conductors; otherwise 240.4(B) allows the next standard rating up.
      const allowed = small != null ? Math.min(small, amp) : nextStandardRating(amp);
      if (c.ratingA > allowed) wrongConductor.push(l);

      const amps = circuitAmps(panel, c);
      if (amps * (c.continuous ? 1.25 : 1) > c.ratingA + 1e-9) overloaded.push(`${l} ${amps.toFixed(1)} A`);

      const vd = voltageDropPct(panel, c);
      if (vd != null && vd > 3) highDrop.push(`${l} ${vd.toFixed(1)} %`);
    }
    assert.deepEqual(wrongConductor, ['clinic-LB pos 13 "Break room microwave"', 'cottage-LC1 pos 1 "Range (2-pole)"']);
    assert.deepEqual(overloaded, []);
    assert.equal(highDrop.length, 1, highDrop.join('; '));
    assert.match(highDrop[0]!, /^clinic-LA pos 31 "Monument sign & drive lights" 7\.\d %$/);

    const vague = circuits.filter(({ c }) => /^(misc\.?|\?+)$/i.test(c.description.trim()));
    assert.deepEqual(vague.map(({ panel, c }) => label(panel, c)), ['lofts-1LA pos 25 "misc"']);
    const named = circuits.filter(({ c }) => /\b[A-Z][a-z]+'s\b/.test(c.description));
    assert.deepEqual(named.map(({ panel, c }) => label(panel, c)), [`clinic-LA pos 27 "Dana's office"`]);
  });

  it('the older load centre LC-1 raises the 60 °C termination warning through the shared check (NEC 110.14(C)(1)(a) [V])', () => {
    const lc1 = panels.find((p) => p.key === 'cottage-LC1');
    assert.ok(lc1);
    const range = lc1.circuits.find((c) => c.position === 1);
    assert.ok(range);
    const warnings = circuitWarnings(range, lc1);
    assert.deepEqual(warnings.map((w) => w.code), ['conductor-too-small']);
    assert.match(warnings[0].message, /40 A at 60 °C/);
    // the same circuit with terminations marked 75 °C would be fine: the panel's record decides
    assert.deepEqual(circuitWarnings(range, { ...lc1, terminationTempC: 75 }), []);
  });

  it('gives the survey\u2019s load as one figure: the hot-lug reading\u2019s amps, the survey\u2019s % of normal and the finding\u2019s words agree', () => {
    const lug = DEMO_RECORD.readings.find((r) => r.key === 'hot-lug');
    assert.ok(lug);
    const pct = percentOfNormal(Number(lug.loadA), Number(lug.referenceLoadA));
    assert.equal(pct, 88, '11 A of a normal 12.5 A');
    const survey = DEMO_RECORD.inspections.find((i) => i.key === 'survey');
    assert.equal(survey?.loadPct, pct);
    const finding = DEMO_RECORD.deficiencies.find((d) => d.readingKey === 'hot-lug');
    for (const said of finding?.description.match(/\d+(?:\.\d+)? ?% of normal/g) ?? []) assert.equal(said.replace(/ ?% of normal/, ''), String(pct));
  });

  it('has the four demo users, one per role', () => {
    assert.equal(DEMO_USERS.length, 4);
    assert.deepEqual(new Set(DEMO_USERS.map((u) => u.role)), new Set(ROLES));
    for (const u of DEMO_USERS) {
      assert.equal(u.email, `${u.role}@ampwright.test`);
      assert.ok(u.name.length > 0);
    }
    assert.equal(DEMO_PASSWORD, 'ampwright-demo');
  });
});

describe('demo fault current (issue 13 item 7): one breaker flagged', () => {
  it('clinic LA: 14 kA on the label, every breaker 22 kA but the 10 kA replacement at 33 (NEC 110.9 [V])', () => {
    const la = DEMO_BUILDINGS.flatMap((b) => b.panels).find((p) => p.key === 'clinic-LA')!;
    const check = panelFaultCheck(
      { availableFaultKA: la.availableFaultKA ?? null, shortCircuitKA: la.shortCircuitKA, seriesRated: false },
      la.circuits.map((c) => ({ ...c, id: String(c.position), interruptingKA: c.interruptingKA ?? null })),
    );
    assert.ok(check.judged);
    if (!check.judged) return;
    assert.deepEqual(check.findings.map((f) => f.id), ['33']);
  });
});
