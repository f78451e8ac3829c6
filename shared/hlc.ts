/**
 * Hybrid logical clock (Kulkarni, Demirbas et al., "Logical Physical Clocks", 2014).
 * A stamp is `<ISO-8601 millis>-<4-hex counter>-<deviceId>`: fixed width up to the device id,
 * so stamps compare correctly as plain strings.
 */

export interface HlcState {
  wallMs: number;
  counter: number;
  deviceId: string;
}

const COUNTER_MAX = 0xffff;

export function formatHlc({ wallMs, counter, deviceId }: HlcState): string {
  return `${new Date(wallMs).toISOString()}-${counter.toString(16).padStart(4, '0')}-${deviceId}`;
}

export function parseHlc(stamp: string): HlcState {
  const match = /^(\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z)-([0-9a-f]{4})-(.+)$/.exec(stamp);
  if (!match) throw new Error(`not an HLC stamp: ${stamp}`);
  return { wallMs: Date.parse(match[1]), counter: parseInt(match[2], 16), deviceId: match[3] };
}

export function isHlc(stamp: string): boolean {
  try {
    parseHlc(stamp);
    return true;
  } catch {
    return false;
  }
}

function bump(state: HlcState, wallMs: number, counter: number): HlcState {
  // the counter is 16 bits wide in the stamp; past it, borrow a millisecond instead of overflowing
  if (counter > COUNTER_MAX) return { ...state, wallMs: wallMs + 1, counter: 0 };
  return { ...state, wallMs, counter };
}

/** Advance the clock for a local event (a write) and return the new state. */
export function hlcSend(state: HlcState, nowMs: number): HlcState {
  if (nowMs > state.wallMs) return { ...state, wallMs: nowMs, counter: 0 };
  return bump(state, state.wallMs, state.counter + 1);
}

/** Merge a stamp received from elsewhere, so the next local stamp sorts after it. */
export function hlcRecv(state: HlcState, remoteStamp: string, nowMs: number): HlcState {
  const remote = parseHlc(remoteStamp);
  const wallMs = Math.max(state.wallMs, remote.wallMs, nowMs);
  if (wallMs === state.wallMs && wallMs === remote.wallMs) {
    return bump(state, wallMs, Math.max(state.counter, remote.counter) + 1);
  }
  if (wallMs === state.wallMs) return bump(state, wallMs, state.counter + 1);
  if (wallMs === remote.wallMs) return bump(state, wallMs, remote.counter + 1);
  return { ...state, wallMs, counter: 0 };
}
