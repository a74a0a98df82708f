/** A finding, as docs/rules.md fixes it. */
export type Severity = 'error' | 'warning' | 'info';

export interface Finding {
  /** Rule id, e.g. `caps.power-rules-missing`. */
  rule: string;
  severity: Severity;
  /** One plain sentence a support engineer can paste to a customer. */
  message: string;
  /** Source of the rule: specification, revision, section or table; or "common practice". */
  ref: string;
  /** Time in microseconds from the start of a trace. */
  t?: number;
  /** 1-based line of an input file. */
  line?: number;
  /** 1-based object position. */
  object?: number;
}
