/**
 * This install's identity and hybrid logical clock. Loaded once at start (before any write can be
 * made), advanced on every local write and on every server reply, saved after each change.
 */
import { uuidv7 } from 'uuidv7';
import { formatHlc, hlcRecv, hlcSend, type HlcState } from '@/shared/hlc';
import { kv } from './storage';

const KEY = 'ampwright:device';
let clock: HlcState | null = null;

export async function loadDevice(): Promise<void> {
  if (clock) return;
  const saved = await kv.getItem(KEY).catch(() => null);
  if (saved) {
    try {
      clock = JSON.parse(saved) as HlcState;
      return;
    } catch {
      // unreadable: start a new identity below rather than refuse to run
    }
  }
  clock = { wallMs: 0, counter: 0, deviceId: `d-${uuidv7()}` };
  await save();
}

function save(): Promise<void> {
  return kv.setItem(KEY, JSON.stringify(clock)).catch(() => undefined);
}

function current(): HlcState {
  if (!clock) throw new Error('loadDevice() must run before the first write');
  return clock;
}

export function deviceId(): string {
  return current().deviceId;
}

/** A fresh stamp for a local write. */
export function stamp(): string {
  clock = hlcSend(current(), Date.now());
  void save();
  return formatHlc(clock);
}

/** Take in the server's stamp so the next local write sorts after everything seen. */
export function observe(serverHlc: string): void {
  try {
    clock = hlcRecv(current(), serverHlc, Date.now());
    void save();
  } catch {
    // a malformed stamp from a proxy must not stop the sync
  }
}
