/**
 * What the analyser may reuse across many traces of one negotiation: a fault sweep analyses
 * hundreds of runs that repeat the same few messages, so each is decoded once and each offer list
 * is checked against the rules engine once for the whole campaign. Both are pure functions of the
 * bytes, so sharing them changes no finding; each trace still counts its own uses (what it reports
 * once per distinct message stays once per trace). Bounded: a map is emptied past `limit`.
 */
import type { EngineError } from '../core/result.ts';
import type { Finding } from '../core/finding.ts';
import type { Message } from '../pd/types.ts';
import type { DecodedMessage } from './decode-cache.ts';

export interface DecodeOutcome {
  decoded: DecodedMessage | undefined;
  error: EngineError | undefined;
}

export interface TypedOutcome {
  message: Message;
  warnings: Finding[];
}

export interface AnalyserMemo {
  /** Key (sop and hex) → the message decoded alone. */
  decoded: Map<string, DecodeOutcome>;
  /** Key (offers, sop and hex) → a Request decoded against those offers. */
  typed: Map<string, TypedOutcome>;
  /** Data objects' hex of a Source_Capabilities → the rules engine's findings on its offers (no time or line). */
  capsFindings: Map<string, readonly Finding[]>;
  limit: number;
}

export function createAnalyserMemo(limit = 4_096): AnalyserMemo {
  return { decoded: new Map(), typed: new Map(), capsFindings: new Map(), limit };
}

/** The memo's value for `key`, computed once; the map is emptied when it reaches the limit. */
export function remember<V>(memo: AnalyserMemo | undefined, map: keyof Omit<AnalyserMemo, 'limit'>, key: string, compute: () => V): V {
  if (!memo) return compute();
  const store = memo[map] as unknown as Map<string, V>;
  let value = store.get(key);
  if (value === undefined) {
    if (store.size >= memo.limit) store.clear();
    value = compute();
    store.set(key, value);
  }
  return value;
}
