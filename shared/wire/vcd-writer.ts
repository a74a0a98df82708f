/**
 * Packets → a CC-line waveform as a Value Change Dump (IEEE 1364-2005 §18.2): one 1-bit wire named
 * `cc`, low while idle, each packet BMC-coded at `bitrate` (USB PD R3.2 §5.8.1; nominal 300 kbps,
 * fBitRate 270–330 kbps in the BMC common parameters, from memory), `gapUs` of idle before and
 * between the packets. The file ends at least TAIL_IDLE_MIN_US after the last packet: a receiver
 * (and sigrok's decoder, which wakes once per millisecond of idle) only closes a packet once it has
 * seen the line idle.
 */
import { bmcEncode } from './bmc.ts';
import { packetBits } from './packet-bits.ts';
import type { WirePacket } from './types.ts';
import { parseTimescaleUs, type VcdTimescale } from './vcd-timescale.ts';

export interface WaveformOptions {
  /** Bits per second (default 300 000). */
  bitrate?: number;
  /** Idle time before, between and after packets, in µs (default 500). */
  gapUs?: number;
  /** Default `1 ns`. */
  timescale?: VcdTimescale;
  /** Default `cc`. */
  signalName?: string;
}

export const DEFAULT_BITRATE_BPS = 300_000;
export const DEFAULT_GAP_US = 500;
export const TAIL_IDLE_MIN_US = 2_000;

/**
 * The coarsest tick that keeps a BMC waveform readable at `bitrate`: a quarter UI, so that rounding
 * an edge to its tick moves it at most an eighth of a UI, well inside the quarter-UI margin a
 * receiver has between a half-bit and a whole-bit interval (USB PD R3.2 V1.1 §5.8.1 BMC; the margin
 * is common practice for BMC receivers).
 */
export function maxTickUs(bitrate: number): number {
  return 1_000_000 / bitrate / 4;
}

export function encodeWaveform(packets: WirePacket[], options: WaveformOptions = {}): { vcd: string; durationUs: number } {
  const bitrate = options.bitrate ?? DEFAULT_BITRATE_BPS;
  const gapUs = options.gapUs ?? DEFAULT_GAP_US;
  const timescale = options.timescale ?? '1 ns';
  const tickUs = parseTimescaleUs(timescale) ?? 1e-3;
  const uiUs = 1_000_000 / bitrate;

  const out: string[] = [
    '$version Parley wire encoder $end',
    `$comment ${packets.length} packet(s) at ${bitrate} bit/s, ${gapUs} us idle between $end`,
    `$timescale ${timescale} $end`,
    '$scope module parley $end',
    `$var wire 1 ! ${options.signalName ?? 'cc'} $end`,
    '$upscope $end',
    '$enddefinitions $end',
    '#0',
    '$dumpvars',
    '0!',
    '$end',
  ];
  let lastTicks = 0;
  let high = false;
  let cursorUs = gapUs;
  for (const packet of packets) {
    const { edgesUs, endUs } = bmcEncode(packetBits(packet), cursorUs, uiUs);
    for (const edgeUs of edgesUs) {
      // Coarse timescales could round two edges onto one tick; keep every edge its own tick.
      const ticks = Math.max(lastTicks + 1, Math.round(edgeUs / tickUs));
      high = !high;
      out.push(`#${ticks}`, high ? '1!' : '0!');
      lastTicks = ticks;
    }
    cursorUs = endUs + gapUs;
  }
  if (packets.length > 0) cursorUs += Math.max(0, TAIL_IDLE_MIN_US - gapUs);
  out.push(`#${Math.max(lastTicks + 1, Math.round(cursorUs / tickUs))}`);
  return { vcd: out.join('\n') + '\n', durationUs: Math.round(cursorUs) };
}
