/** Public entry of the rules engine (interfaces: "shared/rules"). */
export { ruleCatalog, ruleIds, isRuleId, ruleGroup, makeFinding } from './catalog.ts';
export type { RuleId, RuleEntry, RuleGroup, RuleBasis } from './catalog.ts';
export { sinkPolicySchema } from './sink-policy.ts';
export type { SinkPolicy, SinkPolicyKind, ChooseRequestOptions, ChosenRequest } from './sink-policy.ts';
export { checkCaps, type CheckCapsOptions, type CapsReport } from './check-caps.ts';
export { checkStructure } from './check-structure.ts';
export { powerRulesFor, checkPowerRules, type PowerRulesRequirement, type RequiredFixed } from './power-rules.ts';
export { definedPpsRanges, isDefinedPpsRange, checkProgrammableRanges, type DefinedRange } from './programmable-ranges.ts';
export { checkCableCurrent } from './cable-current.ts';
export { inferPdpW } from './infer-pdp.ts';
export { parseLabel, checkLabel, type LabelEntry, type PrintedRating } from './label.ts';
export { chooseRequest } from './choose-request.ts';
export { checkRequest } from './check-request.ts';
export { contractOf, typedRdo } from './contract-of.ts';
export { describePdo, isEprPdo, isPadding, offerCurrentMa, offerMaxPowerMw, voltageRangeMv, DEFAULT_CABLE_MA, EPR_CABLE_MA } from './pdo-facts.ts';
export { readCapsHex, readPdoList, type ReadCaps } from './read-caps.ts';
export { requestMessageHex } from './request-message.ts';
export { fixedPdo, variablePdo, batteryPdo, ppsApdo, eprAvsApdo, sprAvsApdo, paddingPdo } from './pdo-builders.ts';
