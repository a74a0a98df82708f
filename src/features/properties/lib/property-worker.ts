import { useEffect, useState } from 'react';
import { createEngineWorker, progress, type EngineWorker } from '../../../lib/engine-worker.ts';
import type { PropertyApi, PropertyCheck, PropertyProgress } from '../../../../workers/property.worker.ts';

export type { PropertyCheck, PropertyProgress };

export function createPropertyWorker(): EngineWorker<PropertyApi> {
  return createEngineWorker<PropertyApi>(() => new Worker(new URL('../../../../workers/property.worker.ts', import.meta.url), { type: 'module' }));
}

/** One property worker for the life of the page (ended on unmount; Cancel starts a fresh one). */
export function usePropertyWorker(): EngineWorker<PropertyApi> | null {
  const [worker, setWorker] = useState<EngineWorker<PropertyApi> | null>(null);
  useEffect(() => {
    const created = createPropertyWorker();
    setWorker(created);
    return () => created.terminate();
  }, []);
  return worker;
}

/** Checks a property vector (the file as JSON) in the worker, reporting runs and shrinks. */
export function checkInWorker(worker: EngineWorker<PropertyApi>, vector: unknown, onProgress: (p: PropertyProgress) => void): Promise<PropertyCheck> {
  return worker.run<PropertyCheck>(async (api) => api.check(vector, progress(onProgress)));
}
