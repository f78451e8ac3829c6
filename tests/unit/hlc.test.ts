/**
 * The hybrid logical clock of shared/hlc.ts (Kulkarni, Demirbas et al., "Logical Physical Clocks",
 * 2014): the properties sync relies on, checked with fast-check over arbitrary clocks and wall
 * times, plus the fixed-width stamp format from SYNC.md.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { formatHlc, hlcRecv, hlcSend, isHlc, parseHlc, type HlcState } from '../../shared/hlc';

// years 1970–9999 keep the ISO part fixed width (24 characters)
const MAX_MS = Date.UTC(9999, 11, 31, 23, 59, 59, 0);
const wallMs = fc.integer({ min: 0, max: MAX_MS });
/** wall times near each other, so clocks meet in the same millisecond often */
const nearWall = (base: number) => fc.integer({ min: Math.max(0, base - 50), max: Math.min(MAX_MS, base + 50) });
const deviceId = fc.stringMatching(/^[A-Za-z0-9_.:-]{1,24}$/);
const counter = fc.integer({ min: 0, max: 0xffff });
// plain objects: fc.record makes null-prototype ones, which deepStrictEqual tells apart
const state: fc.Arbitrary<HlcState> = fc.record({ wallMs, counter, deviceId }).map((s) => ({ ...s }));

/** (wall, counter) order, the order an HLC promises */
function compareClock(a: HlcState, b: HlcState): number {
  return a.wallMs - b.wallMs || a.counter - b.counter;
}

describe('stamp format (SYNC.md: ISO millis - 4 hex counter - device id)', () => {
  const rows: { state: HlcState; stamp: string }[] = [
    { state: { wallMs: 0, counter: 0, deviceId: 'a' }, stamp: '1970-01-01T00:00:00.000Z-0000-a' },
    {
      state: { wallMs: Date.UTC(2026, 0, 2, 3, 4, 5, 6), counter: 0x1f, deviceId: 'phone-7' },
      stamp: '2026-01-02T03:04:05.006Z-001f-phone-7',
    },
    {
      state: { wallMs: Date.UTC(2026, 11, 31, 23, 59, 59, 999), counter: 0xffff, deviceId: '0190-ab' },
      stamp: '2026-12-31T23:59:59.999Z-ffff-0190-ab',
    },
  ];
  for (const { state: s, stamp } of rows) {
    it(`${JSON.stringify(s)} → ${stamp}`, () => {
      assert.equal(formatHlc(s), stamp);
      assert.deepEqual(parseHlc(stamp), s);
    });
  }

  for (const bad of ['', '2026-01-02T03:04:05Z-0000-a', '2026-01-02T03:04:05.006Z-00g0-a', '2026-01-02T03:04:05.006Z-0000-']) {
    it(`refuses ${JSON.stringify(bad)}`, () => {
      assert.equal(isHlc(bad), false);
      assert.throws(() => parseHlc(bad));
    });
  }
});

describe('properties', () => {
  it('parse ∘ format is the identity on states, format ∘ parse on stamps', () => {
    fc.assert(
      fc.property(state, (s) => {
        const stamp = formatHlc(s);
        assert.deepEqual(parseHlc(stamp), s);
        assert.equal(formatHlc(parseHlc(stamp)), stamp);
      }),
    );
  });

  it('stamps sort as text exactly like their (wall, counter) order', () => {
    fc.assert(
      fc.property(state, state, (a, b) => {
        const byClock = compareClock(a, b);
        const x = formatHlc(a);
        const y = formatHlc(b);
        if (byClock < 0) assert.ok(x < y, `${x} < ${y}`);
        if (byClock > 0) assert.ok(x > y, `${x} > ${y}`);
        // equal clocks: the device id decides, which is what breaks ties between devices
        if (byClock === 0) assert.equal(x < y, a.deviceId < b.deviceId);
      }),
    );
  });

  it('send is strictly monotonic whatever the wall clock does (even going backwards)', () => {
    fc.assert(
      fc.property(state, fc.array(fc.integer({ min: -5000, max: 5000 }), { minLength: 1, maxLength: 60 }), (start, steps) => {
        let s: HlcState = { ...start, wallMs: Math.min(start.wallMs, MAX_MS - 10_000_000) };
        let now = s.wallMs;
        let previous = formatHlc(s);
        for (const step of steps) {
          now = Math.max(0, now + step);
          const next = hlcSend(s, now);
          assert.ok(compareClock(next, s) > 0, 'clock advances');
          assert.ok(next.wallMs >= now, 'never behind the wall clock');
          const stamp = formatHlc(next);
          assert.ok(stamp > previous, `${stamp} after ${previous}`);
          previous = stamp;
          s = next;
        }
      }),
    );
  });

  it('send past the 16-bit counter borrows a millisecond instead of overflowing', () => {
    const s = hlcSend({ wallMs: 1000, counter: 0xffff, deviceId: 'd' }, 1000);
    assert.deepEqual(s, { wallMs: 1001, counter: 0, deviceId: 'd' });
    assert.ok(formatHlc(s) > formatHlc({ wallMs: 1000, counter: 0xffff, deviceId: 'd' }));
  });

  it('recv sorts after both the remote stamp and the previous local state', () => {
    fc.assert(
      fc.property(
        wallMs.chain((base) =>
          fc.tuple(
            fc.record({ wallMs: nearWall(base), counter, deviceId }),
            fc.record({ wallMs: nearWall(base), counter, deviceId }),
            nearWall(base),
          ),
        ),
        ([local, remote, now]) => {
          const next = hlcRecv(local, formatHlc(remote), now);
          assert.ok(compareClock(next, remote) > 0, 'after the remote stamp');
          assert.ok(compareClock(next, local) > 0, 'after the previous state');
          assert.ok(next.wallMs >= now, 'never behind the wall clock');
          assert.equal(next.deviceId, local.deviceId, 'keeps its own device id');
        },
      ),
    );
  });

  it('a send after a recv sorts after the received stamp (causality carries through the server)', () => {
    fc.assert(
      fc.property(state, state, wallMs, (local, remote, now) => {
        const after = hlcSend(hlcRecv(local, formatHlc(remote), now), now);
        assert.ok(compareClock(after, remote) > 0);
      }),
    );
  });
});
