/** Public entry of the vector engine: schemas, byte-stable format, matching, the runner. */
export {
  vectorSchema,
  decodeVectorSchema,
  encodeVectorSchema,
  capsVectorSchema,
  requestVectorSchema,
  negotiationVectorSchema,
  traceVectorSchema,
  propertyVectorSchema,
  sweepVectorSchema,
  findingsExpectSchema,
  VECTOR_ID_PATTERN,
  VECTOR_KINDS,
  vectorJsonSchema,
  scenarioJsonSchema,
  traceJsonSchema,
  describeZodError,
  type Vector,
  type VectorInput,
  type VectorKind,
} from './schema.ts';
export { formatVector, KEY_ORDER } from './format.ts';
export { matchPartial, matchFindings, matchSequence, matchWithin, describeMismatches, type Mismatch, type FindingsExpectation } from './match.ts';
export { runVector, runVectorText, parseVector, counterexampleVector, type VectorResult, type RunOptions } from './run.ts';
export { checkProperty, compileProperty, toJsonSafe, type PropertyOutcome, type PropertyContext } from './property.ts';
export { engine, type EngineFacade } from './engine-facade.ts';
export { arbitraries } from './arbitraries.ts';
export { globToRegExp, matchesGlob } from './glob.ts';
export { toJunitXml, type JunitCase } from './junit.ts';
