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

/** Share of a bit's timing error that moves the recovered clock's phase, and its period. */
const PHASE_GAIN = 0.3;
const PERIOD_GAIN = 0.05;
/** The closing edge is looked for this far (in UI) either side of where the clock expects it. */
const CLOSE_WINDOW_UI = 0.4;

/** True when two edges from index `from` to `to` are closer than `minUs` (a glitch: judge by majority then). */
function hasPulseUnder(edgesUs: readonly number[], from: number, to: number, minUs: number): boolean {
  for (let i = from + 1; i <= to; i++) if (edgesUs[i]! - edgesUs[i - 1]! < minUs) return true;
  return false;
}

/**
 * The edge that closes a bit: of the edges within the window around the expected end, the one that
 * best fits, where a candidate with an odd number of edges before it in the bit (a 1) is also
 * judged by how near the nearest of those is to mid-bit (its index; -1 when none). On a coarse sampling grid the mid-bit
 * edge of a 1 and the closing edge can lie equally far from the expected end; this tells them apart.
 */
function closingEdge(edgesUs: readonly number[], next: number, startUs: number, expectedUs: number, ui: number): number {
  const midUs = startUs + ui / 2;
  let best = -1;
  let bestCost = Infinity;
  for (let i = firstAfter(edgesUs, expectedUs - CLOSE_WINDOW_UI * ui, next); i < edgesUs.length && edgesUs[i]! <= expectedUs + CLOSE_WINDOW_UI * ui; i++) {
    let cost = Math.abs(edgesUs[i]! - expectedUs);
    const inside = i - next;
    if (inside % 2 === 1) {
      let nearestMidUs = Infinity;
      for (let j = next; j < i; j++) nearestMidUs = Math.min(nearestMidUs, Math.abs(edgesUs[j]! - midUs));
      cost = (cost + nearestMidUs) / 2;
    }
    if (cost < bestCost) {
      bestCost = cost;
      best = i;
    }
  }
  return best;
}

/**
 * Edge times → bits at a starting unit interval, on a recovered bit clock (a phase-locked loop):
 * each bit is expected to end one UI after it starts; the edge that best fits there (within 0.4 UI)
 * closes it and moves the clock by 30 % of its error and the period by 5 %, so the quantization of
 * a sampled capture (an edge seen up to one sample late) and edge jitter average out instead of
 * being copied into the next bit, while a rate anywhere in 270–330 kbps, or drifting, is followed.
 * A bit whose opening and closing edges are both known is a 1 when an odd number of edges lie
 * between them (intervals counted as halves or wholes, as a receiver does); when an edge is missing
 * or a pulse under a quarter UI lies inside, the bit is judged by the line's level over its two
 * halves, each by the majority of the time, so such a glitch does not change the result.
 * USB PD R3.2 V1.1 §5.8.1 (BMC), §5.8.5 (receiver; from memory).
 */
export function bmcDecode(edgesUs: readonly number[], uiUs: number): BmcBits {
  const bits: number[] = [];
  const startsUs: number[] = [];
  let violations = 0;
  if (edgesUs.length < 2 || !(uiUs > 0)) return { bits, startsUs, violations };
  const lastUs = edgesUs[edgesUs.length - 1]!;
  let ui = uiUs;
  let startUs = edgesUs[0]!;
  let next = 1; // first edge after startUs
  let opening = 0; // index of the edge that opened this bit; -1 after a missing closing edge
  while (startUs + 0.75 * ui <= lastUs) {
    const expectedUs = startUs + ui;
    const closing = closingEdge(edgesUs, next, startUs, expectedUs, ui);
    const bestUs = closing < 0 ? Infinity : edgesUs[closing]!;
    let endUs = expectedUs;
    if (bestUs === Infinity) violations++;
    else {
      const errorUs = bestUs - expectedUs;
      endUs = expectedUs + PHASE_GAIN * errorUs;
      ui += PERIOD_GAIN * errorUs;
    }
    if (closing >= 0 && opening >= 0 && !hasPulseUnder(edgesUs, opening, closing, ui / 4)) {
      // Both edges of the bit known: it is a 1 when an odd number of edges lie between them (a glitch adds two).
      bits.push((closing - opening - 1) & 1);
    } else {
      const midUs = (startUs + endUs) / 2;
      const firstHalf = oddShare(edgesUs, startUs, midUs, next) > 0.5;
      const secondHalf = oddShare(edgesUs, midUs, endUs, firstAfter(edgesUs, midUs, next)) > 0.5;
      bits.push(firstHalf === secondHalf ? 0 : 1);
    }
    startsUs.push(startUs);
    startUs = endUs;
    opening = closing;
    next = closing >= 0 ? Math.max(closing + 1, firstAfter(edgesUs, startUs, next)) : firstAfter(edgesUs, startUs, next);
  }
  return { bits, startsUs, violations };
}

/**
 * Unit interval from the start of a burst, by classifying its intervals as half or whole bits:
 * a first guess from the mean interval (the preamble's alternating bits give one whole and two
 * halves per two bits, so the mean is 2/3 UI), then the span of the intervals over the number of
 * UIs they hold once each is called half (under 3/4 UI) or whole. Using the span, not each
 * interval, keeps a sampled capture's quantization out of the estimate (a 1 µs grid moves each
 * edge by up to a third of a UI). The first interval is skipped: the first edge may be lost (§5.8.1).
 */
export function estimateUiUs(edgesUs: readonly number[], sample = 48): number {
  const from = edgesUs.length > sample + 2 ? 1 : 0;
  const to = Math.min(edgesUs.length - 1, from + sample);
  if (to <= from) return 0;
  const spanUs = edgesUs[to]! - edgesUs[from]!;
  let ui = (1.5 * spanUs) / (to - from);
  for (let round = 0; round < 3; round++) {
    let units = 0;
    for (let i = from + 1; i <= to; i++) units += edgesUs[i]! - edgesUs[i - 1]! < 0.75 * ui ? 0.5 : 1;
    if (units > 0) ui = spanUs / units;
  }
  return ui;
}
