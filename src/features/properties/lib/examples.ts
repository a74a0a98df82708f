/**
 * The example picker's contents: every property vector of the built-in library
 * (`vectors/property/**`, bundled as text at build time) and the planted-bug demonstration.
 */
import { plantedBugExample } from './planted-bug.ts';
import { withContextType } from './context-type.ts';

export type PropertyExample = {
  /** The vector's id (unique; the picker's value). */
  id: string;
  title: string;
  tags: string[];
  ref: string;
  code: string;
  runs: number;
  seed: number;
  holds: boolean;
  /** Where it comes from, for the picker's groups. */
  origin: 'library' | 'demo';
};

type PropertyFile = { id?: unknown; title?: unknown; tags?: unknown; ref?: unknown; kind?: unknown; input?: { code?: unknown; runs?: unknown; seed?: unknown }; expect?: { holds?: unknown } };

const libraryFiles = import.meta.glob<string>('../../../../vectors/property/**/*.vector.json', { eager: true, query: '?raw', import: 'default' });

/** One property vector file (parsed JSON) as an example, or null when it is not one. */
export function exampleOf(file: PropertyFile, origin: PropertyExample['origin']): PropertyExample | null {
  const { id, title, tags, ref, kind, input, expect } = file;
  if (kind !== 'property' || typeof id !== 'string' || typeof title !== 'string' || typeof input?.code !== 'string') return null;
  return {
    id,
    title,
    tags: Array.isArray(tags) ? tags.filter((tag): tag is string => typeof tag === 'string') : [],
    ref: typeof ref === 'string' ? ref : '',
    code: withContextType(input.code),
    runs: typeof input.runs === 'number' ? input.runs : 100,
    seed: typeof input.seed === 'number' ? input.seed : 1,
    holds: expect?.holds !== false,
    origin,
  };
}

function parse(text: string): PropertyFile {
  try {
    return JSON.parse(text) as PropertyFile;
  } catch {
    return {};
  }
}

/** Shipped ones (tag "shipped") first, then the rest of the library by id, then the demonstration. */
export function loadExamples(files: Record<string, string> = libraryFiles): PropertyExample[] {
  const library = Object.values(files)
    .map((text) => exampleOf(parse(text), 'library'))
    .filter((example): example is PropertyExample => example !== null)
    .sort((a, b) => Number(b.tags.includes('shipped')) - Number(a.tags.includes('shipped')) || a.id.localeCompare(b.id));
  const demo = exampleOf(plantedBugExample as unknown as PropertyFile, 'demo');
  return demo ? [...library, demo] : library;
}

export const examples: readonly PropertyExample[] = loadExamples();

/** A new property: the shape to start from. */
export const blankExample: PropertyExample = {
  id: 'property/my/new-property',
  title: 'A new property',
  tags: [],
  ref: 'common practice',
  code: `export default ({ fc, engine }: PropertyContext) =>
  fc.property(engine.arbitraries.lawfulCaps(), ({ pdpW, pdos }) => {
    const offers = engine.rules.readPdoList(pdos);
    if (!offers.ok) throw new Error(offers.error.message);
    const { findings } = engine.rules.checkCaps(offers.pdos, { pdpW });
    const error = findings.find((f) => f.severity === 'error');
    if (error) throw new Error(\`\${pdpW} W: \${error.rule}: \${error.message}\`);
  });
`,
  runs: 100,
  seed: 1,
  holds: true,
  origin: 'demo',
};
