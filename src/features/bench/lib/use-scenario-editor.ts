/**
 * The Bench's scenario as two views kept in step: the form (react-hook-form) and the JSON text.
 * A valid form change rewrites the text; valid text replaces the form; invalid text keeps its
 * error and leaves the form alone. The first scenario comes from a shared link (#scenario=…) or
 * the default.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import type { ScenarioInput } from '../../../../shared/sim/scenario.ts';
import type { Result } from '../../../../shared/core/result.ts';
import { benchFormResolverSchema, defaultScenario, formOfScenario, parseScenarioText, scenarioOfForm, type BenchFormValues } from './form-model.ts';
import { sharedFromHash } from '../../../lib/share-url.ts';

/** The JSON view's text: two-space indent, keys in the order people read a scenario (source first). */
export const scenarioText = (scenario: ScenarioInput) => `${JSON.stringify(scenario, null, 2)}\n`;

export type Loaded = { input: ScenarioInput; values: BenchFormValues };

/** Scenario JSON text as the form's values, or the reason it cannot be shown ("field: message"). */
export function loadText(text: string): Result<{ loaded: Loaded }> {
  const parsed = parseScenarioText(text);
  if (!parsed.ok) return parsed;
  const form = formOfScenario(parsed.scenario);
  if (!form.ok) return form;
  return { ok: true, loaded: { input: parsed.input, values: form.values } };
}

export const loadScenario = (input: unknown) => loadText(JSON.stringify(input ?? null));

function initialScenario(): { loaded: Loaded; notice: string | null; shared: boolean } {
  const fallback = loadScenario(defaultScenario);
  if (!fallback.ok) throw new Error(fallback.error.message);
  const shared = sharedFromHash(window.location.hash);
  if (!shared) return { loaded: fallback.loaded, notice: null, shared: false };
  if (!shared.ok) return { loaded: fallback.loaded, notice: shared.error.message, shared: false };
  const result = loadScenario(shared.value);
  return result.ok
    ? { loaded: result.loaded, notice: 'Opened the shared scenario from the link.', shared: true }
    : { loaded: fallback.loaded, notice: `The shared scenario could not be opened: ${result.error.message}`, shared: false };
}

export function useScenarioEditor() {
  const [initial] = useState(initialScenario);
  const baseRef = useRef<ScenarioInput>(initial.loaded.input);
  const applyingRef = useRef(false);
  const [jsonText, setJsonText] = useState(() => scenarioText(initial.loaded.input));
  const [jsonError, setJsonError] = useState<string | null>(null);
  const form = useForm<BenchFormValues>({ resolver: zodResolver(benchFormResolverSchema), defaultValues: initial.loaded.values, mode: 'onChange' });

  const apply = useCallback(
    (loaded: Loaded) => {
      applyingRef.current = true;
      baseRef.current = loaded.input;
      form.reset(loaded.values);
      applyingRef.current = false;
      setJsonText(scenarioText(loaded.input));
      setJsonError(null);
    },
    [form],
  );

  useEffect(() => {
    const subscription = form.watch((values) => {
      if (applyingRef.current) return;
      const parsed = benchFormResolverSchema.safeParse(values);
      if (!parsed.success) return;
      const mapped = scenarioOfForm(parsed.data, baseRef.current);
      if (!mapped.ok) return;
      baseRef.current = mapped.scenario;
      setJsonText(scenarioText(mapped.scenario));
      setJsonError(null);
    });
    return () => subscription.unsubscribe();
  }, [form]);

  const onJsonChange = useCallback(
    (text: string) => {
      setJsonText(text);
      const result = loadText(text);
      if (!result.ok) {
        setJsonError(result.error.message);
        return;
      }
      applyingRef.current = true;
      baseRef.current = result.loaded.input;
      form.reset(result.loaded.values);
      applyingRef.current = false;
      setJsonError(null);
    },
    [form],
  );

  /** The scenario the form holds now, or null (after asking the form to show its errors). */
  const current = useCallback((): ScenarioInput | null => {
    const values = benchFormResolverSchema.safeParse(form.getValues());
    if (!values.success) {
      void form.trigger();
      return null;
    }
    const mapped = scenarioOfForm(values.data, baseRef.current);
    return mapped.ok ? mapped.scenario : null;
  }, [form]);

  /** Submitting the form: the mapped scenario to `run`. */
  const submitWith = useCallback(
    (run: (scenario: ScenarioInput) => void) =>
      form.handleSubmit((values) => {
        const mapped = scenarioOfForm(values, baseRef.current);
        if (mapped.ok) run(mapped.scenario);
      }),
    [form],
  );

  return { form, jsonText, jsonError, onJsonChange, apply, current, submitWith, initialNotice: initial.notice, openedShared: initial.shared };
}
