import { memo, useState, type FormEvent } from 'react';
import { FormProvider, type UseFormReturn } from 'react-hook-form';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { cn } from '../../../lib/cn.ts';
import type { BenchFormValues } from '../lib/form-model.ts';
import { ScenarioForm } from './scenario-form.tsx';
import { ScenarioJson } from './scenario-json.tsx';

/**
 * The form on its own, memoised: progress updates and results re-render the page many times a
 * second, and the form's hundred inputs need not follow.
 */
const ScenarioFormPanel = memo(function ScenarioFormPanel({ form, hidden, onSubmit }: { form: UseFormReturn<BenchFormValues>; hidden: boolean; onSubmit(event: FormEvent): Promise<void> }) {
  return (
    <FormProvider {...form}>
      <form id="bench-scenario" aria-label="Scenario" onSubmit={(event) => void onSubmit(event)} noValidate className={hidden ? 'hidden' : ''}>
        <ScenarioForm />
      </form>
    </FormProvider>
  );
});

export type ScenarioPanelProps = {
  form: UseFormReturn<BenchFormValues>;
  onSubmit(event: FormEvent): Promise<void>;
  jsonText: string;
  jsonError: string | null;
  onJsonChange(text: string): void;
  collapsed: boolean;
  onCollapsedChange(collapsed: boolean): void;
};

/**
 * The scenario as a form or as JSON. It collapses to a strip so the run gets the page's width;
 * collapsed, the form stays mounted (hidden), so Run still submits it.
 */
export function ScenarioPanel({ form, onSubmit, jsonText, jsonError, onJsonChange, collapsed, onCollapsedChange }: ScenarioPanelProps) {
  const [tab, setTab] = useState<'form' | 'json'>('form');
  return (
    <Card className={cn(collapsed && 'w-11')}>
      {collapsed ? (
        <button
          type="button"
          className="flex h-full min-h-48 w-full flex-col items-center gap-2 py-3 text-xs font-medium text-slate-700 hover:bg-slate-50 dark:text-slate-200 dark:hover:bg-slate-800"
          onClick={() => onCollapsedChange(false)}
          aria-label="Show the scenario"
          aria-expanded={false}
        >
          <span aria-hidden="true">»</span>
          <span className="[writing-mode:vertical-rl]">Scenario</span>
        </button>
      ) : (
        <CardHeader
          title="Scenario"
          actions={
            <div className="flex items-center gap-2">
              <div role="tablist" aria-label="Scenario view" className="flex rounded-md bg-slate-100 p-0.5 dark:bg-slate-800">
                {(['form', 'json'] as const).map((value) => (
                  <button
                    key={value}
                    type="button"
                    role="tab"
                    aria-selected={tab === value}
                    className={cn(
                      'rounded px-3 py-1 text-xs font-medium',
                      tab === value ? 'bg-white text-slate-900 shadow-xs dark:bg-slate-950 dark:text-slate-50' : 'text-slate-600 dark:text-slate-400',
                    )}
                    onClick={() => setTab(value)}
                  >
                    {value === 'form' ? 'Form' : 'JSON'}
                    {value === 'json' && jsonError && <span className="ml-1 text-red-600">•</span>}
                  </button>
                ))}
              </div>
              <Button variant="ghost" size="sm" onClick={() => onCollapsedChange(true)} aria-label="Hide the scenario" aria-expanded={true}>
                «
              </Button>
            </div>
          }
        />
      )}
      <CardBody className={cn(collapsed && 'hidden')}>
        <ScenarioFormPanel form={form} hidden={tab !== 'form'} onSubmit={onSubmit} />
        {tab === 'json' && <ScenarioJson text={jsonText} error={jsonError} onChange={onJsonChange} />}
      </CardBody>
    </Card>
  );
}
