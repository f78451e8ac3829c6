import { formatHlc, hlcRecv, hlcSend, type HlcState } from '../../shared/hlc';

/** The server's own hybrid logical clock, for writes that arrive without a client stamp. */
let state: HlcState = { wallMs: 0, counter: 0, deviceId: 'server' };

export function serverStamp(): string {
  state = hlcSend(state, Date.now());
  return formatHlc(state);
}

export function observeStamp(stamp: string): void {
  state = hlcRecv(state, stamp, Date.now());
}
