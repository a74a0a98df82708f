/** Public entry of the negotiation simulator (interfaces: "shared/sim"). */
export {
  scenarioSchema,
  faultSchema,
  sourceBehaviourSchema,
  actionSchema,
  eMarkerSchema,
  swapAnswerSchema,
  actionNames,
  parseScenario,
  type Scenario,
  type ScenarioInput,
  type Fault,
  type ActionName,
} from './scenario.ts';
export { simulate, type SimulateOptions, type SimulationResult, type Sample } from './simulate.ts';
export { resolveCaps, type ResolvedCaps, type CapsInput } from './caps.ts';
export type { LaneEntry, TimerSpan, TimedContract, Side } from './types.ts';
export { disagreements, sameContract, CONTRACT_SETTLE_US, type PortView, type PortViews, type Disagreement } from './port-views.ts';
export { expandSamples, SampleReader, sampleRows, SAMPLE_FIELDS, STEP_FIELDS, type PackedSamples } from './sample-buffer.ts';
