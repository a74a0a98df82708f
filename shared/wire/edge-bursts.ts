/**
 * CC-line level changes → bursts of edges, one burst per packet. Spikes shorter than `glitchUs`
 * are dropped with both their edges (so the level sense survives); an idle stretch longer than
 * `idleUs` ends a burst. Packets are at least tInterFrameGap (25 µs, USB PD R3.2 §5.8 table of BMC
 * common parameters, from memory) apart, while no interval inside a packet exceeds 1 UI (3.7 µs at
 * 270 kbps), so the default of 10 µs separates them.
 */
import type { VcdValue } from './vcd-reader.ts';

export interface BurstOptions {
  /**
   * Pulses shorter than this are dropped before decoding (default 0.1 µs, common practice for
   * ringing). Longer pulses up to a quarter UI are handled by the bit decoder's majority vote.
   */
  glitchUs?: number;
  /** Idle longer than this ends a packet (default 10 µs). */
  idleUs?: number;
}

/** Bursts this long are cut (no packet has that many edges); bounds memory on a pathological file. */
const MAX_BURST_EDGES = 50_000;

/** `onBurst` gets the edges and the VCD line of the burst's first edge. */
export function createBurstSplitter(options: BurstOptions, onBurst: (edgesUs: number[], line: number) => void) {
  const glitchUs = options.glitchUs ?? 0.1;
  const idleUs = options.idleUs ?? 10;
  let level: '0' | '1' | null = null;
  let edges: number[] = [];
  let firstLine = 0;

  function flush(): void {
    if (edges.length > 0) {
      const done = edges;
      edges = [];
      onBurst(done, firstLine);
    }
  }

  function edge(tUs: number, line: number): void {
    const lastUs = edges[edges.length - 1];
    if (lastUs !== undefined && tUs - lastUs < glitchUs) {
      edges.pop();
      return;
    }
    if (lastUs !== undefined && (tUs - lastUs > idleUs || edges.length >= MAX_BURST_EDGES)) flush();
    if (edges.length === 0) firstLine = line;
    edges.push(tUs);
  }

  return {
    change(tUs: number, value: VcdValue, line = 0): void {
      if (value === 'x' || value === 'z') {
        flush();
        level = null;
      } else if (level === null) level = value;
      else if (value !== level) {
        level = value;
        edge(tUs, line);
      }
    },
    end: flush,
  };
}
