/**
 * Which faults of a scenario hit a given transmission. A fault selects by `from`, `messageType`,
 * `atMs` (on or after) and `nth` (1 = the first matching one; with `count`, that many from the nth
 * on; without `nth`, every one). Counting is per fault, over transmissions on the wire (a retry is
 * a transmission of its own), so "drop the first GoodCRC" loses exactly one.
 */
import type { Fault } from './scenario.ts';
import type { Side } from './types.ts';

export interface FaultBook {
  faults: readonly Fault[];
  /** Matching transmissions seen so far, per fault. */
  seen: number[];
  /** Per side, the time a `silent` fault took effect (µs), else null. */
  silentSinceUs: Record<Side, number | null>;
}

export function createFaultBook(faults: readonly Fault[]): FaultBook {
  return { faults, seen: faults.map(() => 0), silentSinceUs: { source: null, sink: null } };
}

/** Implicit selectors: `reject` and `wait` count the sink's Requests (EPR_Request too), `no-ps-rdy` the source's PS_RDY. */
function fromOf(fault: Fault): Side | undefined {
  return fault.kind === 'reject' || fault.kind === 'wait' ? 'sink' : fault.kind === 'no-ps-rdy' ? 'source' : fault.from;
}

function typeOf(fault: Fault): string | undefined {
  return fault.kind === 'reject' || fault.kind === 'wait' ? 'Request' : fault.kind === 'no-ps-rdy' ? 'PS_RDY' : fault.messageType;
}

/**
 * Counts this occurrence against every fault of the given kinds that selects it and returns the
 * faults that apply.
 */
const NONE: Fault[] = [];

export function faultsFor(book: FaultBook, kinds: readonly Fault['kind'][], from: Side, messageType: string, tUs: number): Fault[] {
  if (book.faults.length === 0) return NONE;
  const hits: Fault[] = [];
  book.faults.forEach((fault, index) => {
    if (!kinds.includes(fault.kind)) return;
    const side = fromOf(fault);
    if (side !== undefined && side !== from) return;
    const type = typeOf(fault);
    if (type !== undefined && type !== messageType) return;
    if (fault.atMs !== undefined && tUs < fault.atMs * 1_000) return;
    const nth = (book.seen[index] ?? 0) + 1;
    book.seen[index] = nth;
    if (fault.nth === undefined ? fault.count === undefined || nth <= fault.count : nth >= fault.nth && nth < fault.nth + (fault.count ?? 1)) {
      hits.push(fault);
    }
  });
  return hits;
}

/** A `silent` side transmits nothing from the moment its fault first applies. */
export function isSilent(book: FaultBook, from: Side, messageType: string, tUs: number): boolean {
  if (book.faults.length === 0) return false;
  const since = book.silentSinceUs[from];
  if (since !== null && tUs >= since) return true;
  if (faultsFor(book, ['silent'], from, messageType, tUs).length === 0) return false;
  book.silentSinceUs[from] = tUs;
  return true;
}

/**
 * How a source answers the sink's Request under the scenario's faults: `reject` or `wait` instead
 * of Accept, or null. A `wait` fault counts this Request only when no `reject` fault took it.
 */
export function answerFault(book: FaultBook, tUs: number): 'reject' | 'wait' | null {
  if (faultsFor(book, ['reject'], 'sink', 'Request', tUs).length > 0) return 'reject';
  if (faultsFor(book, ['wait'], 'sink', 'Request', tUs).length > 0) return 'wait';
  return null;
}

/** A `no-ps-rdy` fault: the source keeps the PS_RDY it is about to send. */
export function withholdsPsRdy(book: FaultBook, tUs: number): boolean {
  return faultsFor(book, ['no-ps-rdy'], 'source', 'PS_RDY', tUs).length > 0;
}
