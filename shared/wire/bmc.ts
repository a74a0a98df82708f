/**
 * Biphase Mark Coding (USB PD R3.2 §5.8.1): the line changes level at the start of every bit and,
 * for a 1, once more in the middle of the bit. The final bit is closed by one more edge so the
 * receiver can clock it; if that edge leaves the line high it stays high for one more UI and then
 * goes low, where it holds for tHoldLowBMC before the transmitter lets go (§5.8.1 figures of the
 * frame's end, from memory).
 */

export interface BmcEdges {
  /** Times of the level changes, in microseconds. */
  edgesUs: number[];
  /** Time when the line is back at low after the packet, in microseconds. */
  endUs: number;
}

/** Edge times for `bits` sent from `startUs` with a unit interval of `uiUs`; the line starts low. */
export function bmcEncode(bits: readonly number[], startUs: number, uiUs: number): BmcEdges {
  const edgesUs: number[] = [];
  let high = false;
  for (let i = 0; i < bits.length; i++) {
    const bitStartUs = startUs + i * uiUs;
    edgesUs.push(bitStartUs);
    high = !high;
    if (bits[i]) {
      edgesUs.push(bitStartUs + uiUs / 2);
      high = !high;
    }
  }
  // The trailing edge that closes the last bit.
  let endUs = startUs + bits.length * uiUs;
  edgesUs.push(endUs);
  high = !high;
  if (high) {
    endUs += uiUs;
    edgesUs.push(endUs);
  }
  return { edgesUs, endUs };
}

export interface BmcBits {
  bits: number[];
  /** Time of the edge that starts each bit, in microseconds. */
  startsUs: number[];
  /** Bits whose closing edge was missing (the decoder went on one UI later). */
  violations: number;
}

/** Index of the first edge after `tUs` (edges sorted), searching forward from `from`. */
function firstAfter(edgesUs: readonly number[], tUs: number, from: number): number {
  let i = from;
  while (i < edgesUs.length && edgesUs[i]! <= tUs) i++;
  return i;
}

/** Share of [fromUs, toUs) spent at the level reached after an odd number of edges. */
function oddShare(edgesUs: readonly number[], fromUs: number, toUs: number, first: number): number {
  let odd = (first & 1) === 1;
  let atUs = fromUs;
  let oddUs = 0;
  for (let i = first; i < edgesUs.length && edgesUs[i]! < toUs; i++) {
    if (odd) oddUs += edgesUs[i]! - atUs;
    atUs = edgesUs[i]!;
    odd = !odd;
  }
  if (odd) oddUs += toUs - atUs;
  return oddUs / (toUs - fromUs);
}

/**
 * Edge times → bits at a known unit interval, on a recovered bit clock: each bit ends at the edge
 * nearest one UI after its start (within a quarter UI; that edge re-times the clock, so drift does
 * not build up). A bit is a 1 when the line's level over its first half differs from its level over
 * its second half, each judged by the majority of the time, so a pulse shorter than a quarter UI
 * anywhere in the bit does not change the result.
 */
export function bmcDecode(edgesUs: readonly number[], uiUs: number): BmcBits {
  const bits: number[] = [];
  const startsUs: number[] = [];
  let violations = 0;
  if (edgesUs.length < 2 || !(uiUs > 0)) return { bits, startsUs, violations };
  const lastUs = edgesUs[edgesUs.length - 1]!;
  let startUs = edgesUs[0]!;
  let next = 1; // first edge after startUs
  while (startUs + 0.75 * uiUs <= lastUs) {
    // The closing edge: nearest to one UI on, within ±1/4 UI.
    let endUs = startUs + uiUs;
    let bestUs = Infinity;
    for (let i = firstAfter(edgesUs, startUs + 0.75 * uiUs, next); i < edgesUs.length && edgesUs[i]! <= startUs + 1.25 * uiUs; i++) {
      if (Math.abs(edgesUs[i]! - endUs) < Math.abs(bestUs - endUs)) bestUs = edgesUs[i]!;
    }
    if (bestUs === Infinity) violations++;
    else endUs = bestUs;
    const midUs = (startUs + endUs) / 2;
    const firstHalf = oddShare(edgesUs, startUs, midUs, next) > 0.5;
    const secondHalf = oddShare(edgesUs, midUs, endUs, firstAfter(edgesUs, midUs, next)) > 0.5;
    bits.push(firstHalf === secondHalf ? 0 : 1);
    startsUs.push(startUs);
    startUs = endUs;
    next = firstAfter(edgesUs, startUs, next);
  }
  return { bits, startsUs, violations };
}

/**
 * Unit interval from the start of a burst: the preamble's intervals are two halves for every whole
 * one, so the median of the first intervals is half a UI.
 */
export function estimateUiUs(edgesUs: readonly number[], sample = 48): number {
  const lengths: number[] = [];
  for (let i = 1; i < edgesUs.length && i <= sample; i++) lengths.push(edgesUs[i]! - edgesUs[i - 1]!);
  if (lengths.length === 0) return 0;
  lengths.sort((a, b) => a - b);
  return 2 * lengths[Math.floor(lengths.length / 2)]!;
}
