/**
 * The run pool's task: one vector file's text in, its result out (JSON-safe, for the results
 * table). A trace vector's `file` is read from the built-in library folder the id names
 * (`vectors/<folder of the id>/<file>`), never from outside it. Property code never runs in this
 * thread: the pool sends property vectors to the sandbox, and one that reaches a worker anyway is
 * refused here.
 */
import { readFile } from 'node:fs/promises';
import { dirname, resolve, sep } from 'node:path';
import { runVectorText, toJsonSafe, type PropertyOutcome, type VectorResult } from '../../shared/vectors/index.ts';

export interface RunVectorTask {
  text: string;
  vectorId: string;
  /** Folder of the built-in library, for trace vectors that name a file. */
  vectorsRoot: string;
  /**
   * The vector's kind as the library stored it, which spares the request thread parsing the text
   * to route it; a worker still refuses property code whatever this says.
   */
  kind?: string | null;
  /** Who asked for the run (`user:<id>` or `token:<id>`): the property sandbox queues per owner. */
  owner?: string;
}

export function libraryFileReader(vectorsRoot: string, vectorId: string): (path: string) => Promise<string> {
  const root = resolve(vectorsRoot);
  return async (path) => {
    const full = resolve(root, dirname(vectorId), path);
    if (!full.startsWith(root + sep)) throw new Error(`"${path}" is outside the vector library`);
    return readFile(full, 'utf8');
  };
}

async function refuseProperty(_code: string, options: { runs: number; seed: number }): Promise<PropertyOutcome> {
  return { holds: false, numRuns: 0, seed: options.seed, error: { code: 'property.sandbox', message: "property vectors run only in the property sandbox, not in the server's run pool" } };
}

export async function runVectorTask(task: RunVectorTask): Promise<VectorResult> {
  const result = await runVectorText(task.text, task.vectorId, { readFile: libraryFileReader(task.vectorsRoot, task.vectorId), checkProperty: refuseProperty });
  return toJsonSafe(result) as VectorResult;
}

/**
 * What a run keeps of a result: the evidence (expected and actual output, mismatches) of a
 * failure; of a pass only its verdict, message and time, so a pass's output never crosses to the
 * request thread to be copied and collected there.
 */
export function keptOfResult(result: VectorResult): VectorResult {
  if (!result.ok) return result;
  return { id: result.id, ok: true, durationMs: result.durationMs, ...(result.message === undefined ? {} : { message: result.message }) };
}

/** Several vectors in one task: one message each way instead of one per vector keeps the request thread free. */
export async function runVectorBatch(tasks: readonly RunVectorTask[]): Promise<VectorResult[]> {
  const results: VectorResult[] = [];
  for (const task of tasks) results.push(keptOfResult(await runVectorTask(task)));
  return results;
}

export default runVectorTask;
