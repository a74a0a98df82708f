/**
 * Errors as values at the engine's edge: decoding user input never throws, it returns a Failure.
 * Results cross the Web Worker boundary intact (comlink only keeps message/name/stack of a throw).
 */
export interface EngineError {
  /** Stable machine code, e.g. `decode.length`, `input.hex`, `trace.empty`. */
  code: string;
  /** One plain sentence for people. */
  message: string;
  /** Byte (or character) offset into the input where the problem starts. */
  offset?: number;
  /** 1-based line of an input file. */
  line?: number;
}

export interface Failure {
  ok: false;
  error: EngineError;
}

export type Result<T> = ({ ok: true } & T) | Failure;

export function fail(code: string, message: string, where: { offset?: number; line?: number } = {}): Failure {
  return { ok: false, error: { code, message, ...where } };
}
