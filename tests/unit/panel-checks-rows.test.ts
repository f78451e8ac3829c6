/**
 * The register's rows fed to the panel checks (shared/panel-checks.ts): the same inputs for the
 * screens and the report.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { componentRatingC, faultSourceText, panelFaultCheck, peakDemandA } from '../../shared/panel-checks';

const breaker = (id: string, position: number, interruptingKA: number | null, status: 'in-use' | 'spare' | 'space' = 'in-use') => ({
  id, position, ratingA: status === 'space' ? null : 20, status, interruptingKA,
});

describe('panelFaultCheck (NEC 110.9, 110.10 [V])', () => {
  it('22 kA available: a 10 kA breaker is flagged, a 22 kA one is not ("at least equal"), a space is not a breaker', () => {
    const check = panelFaultCheck({ availableFaultKA: 22, shortCircuitKA: 22, seriesRated: false }, [
      breaker('a', 1, 10), breaker('b', 3, 22), breaker('c', 5, null), breaker('d', 7, null, 'space'),
    ]);
    assert.ok(check.judged);
    if (!check.judged) return;
    assert.deepEqual(check.findings.map((f) => f.id), ['a']);
    assert.deepEqual(check.notRecorded, ['Position 5 (20 A)']);
  });
  it('no fault current recorded: not judged, and says so', () => {
    const check = panelFaultCheck({ availableFaultKA: null, shortCircuitKA: 10, seriesRated: false }, [breaker('a', 1, 10)]);
    assert.equal(check.judged, false);
  });
  it('names the source and date', () => {
    assert.equal(faultSourceText({ availableFaultSource: 'label', availableFaultOn: '2025-03-01' }), 'label, 2025-03-01');
  });
});

describe('peakDemandA: kVA to amperes (any electrical handbook: I = VA / V, VA / (√3 V))', () => {
  it('31.5 kVA on 208Y/120 V 3φ → 87.4 A; 24 kVA on 120/240 V 1φ → 100 A; amperes stay amperes', () => {
    assert.equal(Math.round((peakDemandA({ system: '208Y/120V-3ph-4w', peakDemand: 31.5, peakDemandUnit: 'kVA' }) ?? 0) * 10) / 10, 87.4);
    assert.equal(peakDemandA({ system: '120/240V-1ph-3w', peakDemand: 24, peakDemandUnit: 'kVA' }), 100);
    assert.equal(peakDemandA({ system: '120/240V-1ph-3w', peakDemand: 80, peakDemandUnit: 'A' }), 80);
    assert.equal(peakDemandA({ system: '120/240V-1ph-3w', peakDemand: null, peakDemandUnit: null }), null);
  });
});

describe('componentRatingC: the lower of insulation and termination (NEC 110.14(C)(1) [V])', () => {
  it('90 °C wire on a 20 A breaker with terminations not recorded → 60 °C; marked 75 °C → 75 °C', () => {
    const c = { ratingA: 20, conductorSize: '12' as const, insulationTempC: 90 as const, terminationTempC: null };
    assert.equal(componentRatingC(c, { terminationTempC: null })?.ratingC, 60);
    assert.equal(componentRatingC(c, { terminationTempC: 75 })?.ratingC, 75);
    assert.equal(componentRatingC({ ...c, insulationTempC: null }, { terminationTempC: 75 }), null);
  });
});
