/**
 * Captures as a logic analyser records them, for the wire decoder's tests and benchmark: packets
 * BMC-coded (USB PD R3.2 V1.1 §5.8.1) at a bit rate anywhere in fBitRate 270–330 kbps (§5.8, table
 * of BMC common parameters, from memory), every edge moved by Gaussian jitter (σ in UI), the line
 * sampled on a grid (an edge is seen at the first sample after it, as a 1 MHz analyser sees it),
 * and optional glitches: short pulses dropped into a packet at random. Seeded, so reproducible.
 */
import { bmcEncode, packetBits, type WirePacket } from '../../shared/wire/index.ts';

export interface CaptureOptions {
  bitrateBps?: number;
  /** Standard deviation of each edge's displacement, in UI (0.04 = 4 % of a bit). */
  jitterUi?: number;
  /** Sample period of the analyser in µs (0 = exact edge times, written at 1 ns). */
  gridUs?: number;
  /** Glitches per packet (a pulse of `glitchUs` at a random time inside the packet). */
  glitchesPerPacket?: number;
  glitchUs?: number;
  gapUs?: number;
  seed?: number;
}

/** A small seeded generator (mulberry32) so that every capture is reproducible. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b_79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

function gaussian(random: () => number): number {
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

/** Edge times (µs, sorted) of the packets on one line that starts low. */
export function captureEdgesUs(packets: readonly WirePacket[], options: CaptureOptions = {}): { edgesUs: number[]; endUs: number } {
  const random = seededRandom(options.seed ?? 1);
  const uiUs = 1_000_000 / (options.bitrateBps ?? 300_000);
  const gapUs = options.gapUs ?? 500;
  const jitterUs = (options.jitterUi ?? 0) * uiUs;
  const edgesUs: number[] = [];
  let cursorUs = gapUs;
  for (const packet of packets) {
    const encoded = bmcEncode(packetBits(packet), cursorUs, uiUs);
    const ideal = encoded.edgesUs;
    const moved = ideal.map((t) => t + jitterUs * gaussian(random));
    // Jitter never reorders edges (keep each at least a tenth of a UI after the one before).
    for (let i = 1; i < moved.length; i++) moved[i] = Math.max(moved[i]!, moved[i - 1]! + uiUs / 10);
    for (let g = 0; g < (options.glitchesPerPacket ?? 0); g++) {
      const at = ideal[0]! + random() * (ideal[ideal.length - 1]! - ideal[0]!);
      const width = options.glitchUs ?? 0.1;
      moved.push(at, at + width);
    }
    moved.sort((a, b) => a - b);
    edgesUs.push(...moved);
    cursorUs = encoded.endUs + gapUs;
  }
  return { edgesUs, endUs: cursorUs + 2_000 };
}

/** The capture as a VCD: `$timescale 1 ns` for exact edges, else one tick per sample of the grid. */
export function captureVcd(packets: readonly WirePacket[], options: CaptureOptions = {}): string {
  const { edgesUs, endUs } = captureEdgesUs(packets, options);
  const gridUs = options.gridUs ?? 0;
  const tickUs = gridUs > 0 ? gridUs : 0.001;
  // The largest VCD unit (1, 10, 100 ns, 1 µs) that divides the sample period; times are written in it.
  const unitNs = [1000, 100, 10, 1].find((u) => Math.round(tickUs * 1000) % u === 0) ?? 1;
  const timescale = unitNs === 1000 ? '1 us' : `${unitNs} ns`;
  const perTick = Math.round((tickUs * 1000) / unitNs);
  const out = ['$timescale', timescale, '$end', '$scope module capture $end', '$var wire 1 ! cc $end', '$upscope $end', '$enddefinitions $end', '#0', '0!'];
  let level = 0;
  let lastTick = 0;
  let pendingTick = -1;
  // On a sampling grid an edge shows at the next sample; two edges inside one sample period cancel
  // (the analyser never saw the pulse), which is how a real analyser loses a glitch.
  let pendingLevel = 0;
  const flush = () => {
    if (pendingTick >= 0 && pendingLevel !== level) {
      out.push(`#${pendingTick * perTick}`, `${pendingLevel}!`);
      level = pendingLevel;
      lastTick = pendingTick;
    }
    pendingTick = -1;
  };
  let wire = 0;
  for (const t of edgesUs) {
    wire ^= 1;
    const tick = gridUs > 0 ? Math.ceil(t / tickUs - 1e-9) : Math.round(t / tickUs);
    if (tick !== pendingTick) flush();
    pendingTick = Math.max(tick, lastTick + 1);
    pendingLevel = wire;
  }
  flush();
  out.push(`#${Math.max(lastTick + 1, Math.ceil(endUs / tickUs)) * perTick}`);
  return out.join('\n') + '\n';
}
