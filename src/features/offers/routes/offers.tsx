import { zodResolver } from '@hookform/resolvers/zod';
import { lazy, Suspense, useEffect, useMemo, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { useSearchParams } from 'react-router';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { RatingText } from '../../../components/mono.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { isCancelled } from '../../../lib/engine-worker.ts';
import type { OffersAnalysis } from '../../../../shared/rules/analyse-offers.ts';
import { sinkPolicySchema, type SinkPolicy } from '../../../../shared/rules/sink-policy.ts';
import type { Device } from '../../../../shared/api/index.ts';
import { ContractPanel, initialPolicy } from '../components/contract-panel.tsx';
import { FindingsPanel } from '../components/findings-panel.tsx';
import { OffersForm } from '../components/offers-form.tsx';
import { SourceLoader } from '../components/source-loader.tsx';
import { initialFormValues, offersFormSchema, type OffersFormValues } from '../lib/offers-form.ts';
import { encodeOffersState, initialPageState, OFFERS_STATE_PARAM, offersStateFromParams } from '../lib/offers-url.ts';
import { analyseInWorker, readInWorker, useRulesWorker } from '../lib/rules-worker.ts';
import { zodMessage } from '../../../../shared/core/zod-message.ts';

// recharts is large: the chart arrives in its own chunk.
const EnvelopeChart = lazy(() => import('../components/envelope-chart.tsx'));

export function OffersRoute() {
  const worker = useRulesWorker();
  // The page's state is in its URL (?page=…): read once on arrival, written back as it changes.
  const [params, setParams] = useSearchParams();
  const [fromUrl] = useState(() => offersStateFromParams(params));
  const arrived = fromUrl?.ok ? fromUrl.state : initialPageState;
  const form = useForm<OffersFormValues>({ resolver: zodResolver(offersFormSchema), defaultValues: arrived.form, mode: 'onChange' });
  const values = useWatch({ control: form.control });
  const valuesKey = JSON.stringify(values);
  const [policy, setPolicy] = useState<SinkPolicy>(arrived.policy ?? initialPolicy);
  // The one check of the policy: the engine's schema, as the Bench's form uses it.
  const checkedPolicy = useMemo(() => sinkPolicySchema.safeParse(policy), [policy]);
  const policyError = checkedPolicy.success ? undefined : zodMessage(checkedPolicy.error, { where: 'policy', limit: 1 });
  const [analysis, setAnalysis] = useState<OffersAnalysis | null>(null);
  const [engineError, setEngineError] = useState<string>();
  const [hexError, setHexError] = useState<string>();

  useEffect(() => {
    if (!worker) return;
    const parsed = offersFormSchema.safeParse(JSON.parse(valuesKey));
    if (!parsed.success) return; // the form shows the errors beside the fields
    const v = parsed.data;
    const validPolicy = checkedPolicy.success ? checkedPolicy.data : undefined;
    const timer = setTimeout(() => {
      setParams(
        (current) => {
          const next = new URLSearchParams(current);
          next.set(OFFERS_STATE_PARAM, encodeOffersState({ form: v, policy: validPolicy }));
          return next;
        },
        { replace: true, preventScrollReset: true },
      );
      analyseInWorker(worker, {
        offers: v.offers,
        pdpW: v.pdpW === '' ? undefined : Number(v.pdpW),
        cableMa: v.cable === 'unknown' ? undefined : Number(v.cable),
        label: v.label.trim() === '' ? undefined : v.label,
        epr: v.epr,
        policy: validPolicy,
      })
        .then((result) => {
          if (result.ok) {
            setAnalysis(result);
            setEngineError(undefined);
          } else setEngineError(result.error.message);
        })
        .catch((error: unknown) => {
          if (!isCancelled(error)) setEngineError(error instanceof Error ? error.message : String(error));
        });
    }, 120);
    return () => clearTimeout(timer);
  }, [worker, valuesKey, checkedPolicy, setParams]);

  const load = (offers: OffersFormValues['offers'], extra: Partial<OffersFormValues>) => form.reset({ ...initialFormValues, offers, pdpW: '', label: '', ...extra });

  const onDevice = (device: Device) => {
    if (!worker) return;
    void readInWorker(worker, { pdos: device.pdos }).then((read) => {
      if (read.ok) load(read.offers, { pdpW: String(device.pdpW), label: device.ratingLabel, epr: read.epr });
      else setEngineError(read.error.message);
    });
  };
  const onHex = (hex: string) => {
    if (!worker) return;
    void readInWorker(worker, { hex }).then((read) => {
      setHexError(read.ok ? undefined : read.error.message);
      if (read.ok) load(read.offers, { epr: read.epr });
    });
  };

  const cable = values.cable === '3000' || values.cable === '5000' ? Number(values.cable) : undefined;
  return (
    <>
      <PageHeader
        eyebrow="Analyse"
        title="Offers"
        description="Build or load a source's Source_Capabilities, check them against the structural rules and the Power Rules, and see the contract a sink takes."
      />
      <p className="mb-6 max-w-4xl rounded-md border border-amber-300/60 bg-amber-50 px-4 py-2.5 text-xs text-amber-900 dark:border-amber-400/30 dark:bg-amber-400/10 dark:text-amber-200">
        Parley checks and simulates; it does not drive hardware. Real adapters deliver up to 48 V and 5 A: when you test one, follow the USB PD specification, a certified test lab's procedures and
        your local electrical codes.
      </p>
      {fromUrl && !fromUrl.ok && (
        <p role="alert" className="mb-6 max-w-4xl rounded-md border border-red-200 bg-red-50 px-4 py-2.5 text-sm text-red-800 dark:border-red-500/30 dark:bg-red-500/10 dark:text-red-200">
          {fromUrl.error.message}
        </p>
      )}
      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,7fr)_minmax(0,5fr)]">
        <div className="space-y-6">
          <SourceLoader onDevice={onDevice} onHex={onHex} hexError={hexError} />
          <OffersForm form={form} />
        </div>
        <div className="space-y-6">
          {engineError && (
            <p role="alert" className="rounded-md border border-red-200 bg-red-50 px-4 py-2.5 text-sm text-red-800 dark:border-red-500/30 dark:bg-red-500/10 dark:text-red-200">
              {/* A label the engine cannot read is quoted back, with the DC symbol of its example. */}
              <RatingText value={engineError} />
            </p>
          )}
          {analysis ? (
            <FindingsPanel findings={analysis.report.findings} pdpW={analysis.report.pdpW} pdpInferred={analysis.report.pdpInferred} />
          ) : (
            <Card>
              <CardBody className="text-sm text-slate-500">Checking the offers…</CardBody>
            </Card>
          )}
          <Card aria-labelledby="envelope-heading">
            <CardHeader
              title={<span id="envelope-heading">Power envelope</span>}
              description="Current and power of each fixed offer by voltage; programmable ranges as bands; the cable's limit dashed."
            />
            <CardBody>
              <Suspense fallback={<div className="h-80" />}>{analysis && <EnvelopeChart pdos={analysis.pdos} cableMa={cable} />}</Suspense>
            </CardBody>
          </Card>
          <ContractPanel policy={policy} onPolicy={setPolicy} contracts={analysis?.contracts ?? []} error={policyError} />
        </div>
      </div>
    </>
  );
}
