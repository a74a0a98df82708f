/**
 * /bench?fromTrace=<id>: the stored trace's offers, the sink's choices and timing, loaded into the
 * scenario once; the notice says what was taken (or why it could not be).
 */
import { useEffect, useRef } from 'react';
import { useSearchParams } from 'react-router';
import { fail } from '../../../../shared/core/result.ts';
import { useTrace } from '../../../lib/api/get-trace.ts';
import { capturedMessagesOf, scenarioFromMessages } from './scenario-from-trace.ts';
import { loadScenario, type Loaded } from './use-scenario-editor.ts';

export function useTraceScenario(enabled: boolean, apply: (loaded: Loaded) => void, setNotice: (notice: string) => void): void {
  const [searchParams] = useSearchParams();
  const fromTrace = searchParams.get('fromTrace');
  const trace = useTrace(enabled ? fromTrace : null);
  const appliedTrace = useRef<string | null>(null);
  useEffect(() => {
    if (!fromTrace || !trace.data || appliedTrace.current === fromTrace) return;
    appliedTrace.current = fromTrace;
    const captured = capturedMessagesOf(trace.data);
    const derived = captured ? scenarioFromMessages(captured.messages, { endUs: captured.endUs }) : fail('trace.no-timeline', 'The trace has no timeline to read.');
    const loaded = derived.ok ? loadScenario(derived.scenario) : derived;
    if (!loaded.ok) {
      setNotice(`Trace ${fromTrace} could not be opened as a scenario: ${loaded.error.message}`);
      return;
    }
    apply(loaded.loaded);
    setNotice(`Opened trace ${fromTrace} as a scenario. ${derived.ok ? derived.notes.join(' ') : ''} Change one thing and run it to see what would have happened.`);
  }, [fromTrace, trace.data, apply, setNotice]);
  useEffect(() => {
    if (fromTrace && trace.isError) setNotice(`Trace ${fromTrace} could not be loaded: ${trace.error instanceof Error ? trace.error.message : 'unknown error'}`);
  }, [fromTrace, trace.isError, trace.error, setNotice]);
}
