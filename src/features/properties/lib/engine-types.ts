import { useEffect, useState } from 'react';
import type { TypeDeclaration } from '../../../components/code-editor.tsx';

let loading: Promise<TypeDeclaration[]> | null = null;

/** The editor's declarations (engine, fast-check, zod): about 600 KB of text, fetched once, lazily. */
export function useEngineTypes(): readonly TypeDeclaration[] | undefined {
  const [declarations, setDeclarations] = useState<readonly TypeDeclaration[]>();
  useEffect(() => {
    let live = true;
    loading ??= import('virtual:parley/engine-types').then((module) => module.default);
    void loading.then((loaded) => {
      if (live) setDeclarations(loaded);
    });
    return () => {
      live = false;
    };
  }, []);
  return declarations;
}
