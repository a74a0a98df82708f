/**
 * `parley schema vector|scenario|trace` (docs/cli.md): prints the JSON Schema of that
 * format, generated from the engine's zod schemas (the same ones the UI's editors use). `trace` is
 * the schema of one record line; the header line is described in it and kept under `$defs.header`.
 */
import { scenarioJsonSchema, traceJsonSchema, vectorJsonSchema } from '../../shared/vectors/schema.ts';
import { CliError, EXIT_OK, printJson, type CliIo } from '../io.ts';

const schemas: Record<string, () => Record<string, unknown>> = {
  vector: vectorJsonSchema,
  scenario: scenarioJsonSchema,
  trace: traceJsonSchema,
};

export async function run(args: string[], io: CliIo): Promise<number> {
  const names = args.filter((a) => a !== '--json');
  const unknownOption = names.find((a) => a.startsWith('--'));
  if (unknownOption) throw new CliError('usage', `unknown option ${unknownOption}; schema takes vector, scenario or trace`);
  const [name, extra] = names;
  if (name === undefined || extra !== undefined) throw new CliError('usage', 'give one of: vector, scenario, trace');
  // Own keys only: `schema toString` is not a schema.
  const build = Object.hasOwn(schemas, name) ? schemas[name] : undefined;
  if (!build) throw new CliError('usage', `no schema "${name}"; give one of: vector, scenario, trace`);
  printJson(io, build());
  return EXIT_OK;
}
