/** An explicit contract, as docs/cli.md fixes it. */
export type ContractKind = 'fixed' | 'variable' | 'battery' | 'pps' | 'avs';

export interface Contract {
  kind: ContractKind;
  objectPosition: number;
  voltageMv: number;
  /** For a battery contract, derived at `voltageMv`. */
  currentMa: number;
  powerMw: number;
}
