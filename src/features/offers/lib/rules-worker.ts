import { useEffect, useState } from 'react';
import { createEngineWorker, type EngineWorker } from '../../../lib/engine-worker.ts';
import type { RulesApi } from '../../../../workers/rules.worker.ts';
import type { Result } from '../../../../shared/core/result.ts';
import type { AnalyseOffersInput, OffersAnalysis, ReadOffers } from '../../../../shared/rules/analyse-offers.ts';

export function createRulesWorker(): EngineWorker<RulesApi> {
  return createEngineWorker<RulesApi>(() => new Worker(new URL('../../../../workers/rules.worker.ts', import.meta.url), { type: 'module' }));
}

/** One rules worker for the life of the component (ended on unmount). */
export function useRulesWorker(): EngineWorker<RulesApi> | null {
  const [worker, setWorker] = useState<EngineWorker<RulesApi> | null>(null);
  useEffect(() => {
    const created = createRulesWorker();
    setWorker(created);
    return () => created.terminate();
  }, []);
  return worker;
}

/** Typed calls (comlink's Remote type splits a union result into a union of promises). */
export function analyseInWorker(worker: EngineWorker<RulesApi>, input: AnalyseOffersInput): Promise<Result<OffersAnalysis>> {
  return worker.run<Result<OffersAnalysis>>(async (api) => api.analyseOffers(input));
}

export function readInWorker(worker: EngineWorker<RulesApi>, input: { hex: string } | { pdos: string[] }): Promise<Result<ReadOffers>> {
  return worker.run<Result<ReadOffers>>(async (api) => api.readOffers(input));
}
