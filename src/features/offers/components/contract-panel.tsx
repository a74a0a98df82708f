import { Badge } from '../../../components/badge.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Input } from '../../../components/input.tsx';
import { Hex, Mono } from '../../../components/mono.tsx';
import { Select } from '../../../components/select.tsx';
import { policyFields, policyKindHelp, policyKindOptions, type PolicyKind } from '../../../lib/offers-form/policy-fields.ts';
import type { CableContract } from '../../../../shared/rules/analyse-offers.ts';

export type PolicyDraft = { kind: PolicyKind; voltageMv: string; currentMa: string; minVoltageMv: string; maxVoltageMv: string; powerMw: string };

export const initialPolicy: PolicyDraft = { kind: 'max-power', voltageMv: '9000', currentMa: '2000', minVoltageMv: '9000', maxVoltageMv: '20000', powerMw: '45000' };

/** The draft as a sink policy object (validated by the engine's schema in the worker). */
export function policyOf(draft: PolicyDraft): Record<string, unknown> {
  const n = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));
  switch (draft.kind) {
    case 'max-power':
      return { kind: 'max-power' };
    case 'fixed':
    case 'pps':
    case 'avs':
      return { kind: draft.kind, voltageMv: n(draft.voltageMv), currentMa: n(draft.currentMa) };
    case 'range':
      return { kind: 'range', minVoltageMv: n(draft.minVoltageMv), maxVoltageMv: n(draft.maxVoltageMv), powerMw: n(draft.powerMw) };
  }
}

export type ContractPanelProps = {
  draft: PolicyDraft;
  onDraft(draft: PolicyDraft): void;
  contracts: readonly CableContract[];
  error?: string;
};

/** A sink policy and the contract it takes over a 3 A and a 5 A cable, with the Request it sends. */
export function ContractPanel({ draft, onDraft, contracts, error }: ContractPanelProps) {
  return (
    <Card aria-labelledby="contract-heading">
      <CardHeader title={<span id="contract-heading">Contract</span>} description="What a sink with this policy requests, and the contract it gets." />
      <CardBody className="space-y-4">
        <div className="flex flex-wrap items-start gap-3">
          <Select
            label="Sink policy"
            className="w-full"
            options={policyKindOptions}
            value={draft.kind}
            hint={
              <>
                <Mono>{draft.kind}</Mono> · {policyKindHelp[draft.kind]}
              </>
            }
            onChange={(event) => onDraft({ ...draft, kind: event.target.value as PolicyDraft['kind'] })}
          />
          {policyFields[draft.kind].map(({ name, label }) => (
            <Input key={name} label={label} mono inputMode="numeric" className="w-36" value={draft[name]} onChange={(event) => onDraft({ ...draft, [name]: event.target.value })} />
          ))}
        </div>
        {error && (
          <p role="alert" className="text-xs font-medium text-red-600 dark:text-red-400">
            {error}
          </p>
        )}
        {/* One card per cable, side by side only where both fit with the RDO and Request unbroken. */}
        <div className="@container">
          <div className="grid gap-3 @2xl:grid-cols-2">
            {contracts.map((c) => (
              <div key={c.cableMa} className="space-y-2 rounded-md border border-slate-200 p-3 text-sm dark:border-slate-800" role="group" aria-label={`Over a ${c.cableMa / 1_000} A cable`}>
                <p className="flex flex-wrap items-center justify-between gap-2 font-medium text-slate-900 dark:text-slate-100">
                  Over a {c.cableMa / 1_000} A cable
                  {c.capabilityMismatch && <Badge tone="warning">Capability Mismatch</Badge>}
                </p>
                <p className="flex flex-wrap items-baseline gap-x-2">
                  <Mono className="whitespace-nowrap text-slate-900 dark:text-slate-100">
                    {c.contract.kind} {c.contract.voltageMv / 1_000} V · {c.contract.currentMa / 1_000} A · {c.contract.powerMw / 1_000} W
                  </Mono>
                  <span className="text-xs text-slate-500 dark:text-slate-400">from object {c.objectPosition}</span>
                </p>
                <dl className="grid grid-cols-[auto_minmax(0,1fr)] gap-x-3 gap-y-1 text-xs text-slate-600 dark:text-slate-400">
                  <dt>RDO</dt>
                  <dd className="whitespace-nowrap">
                    <Hex value={c.rdo} groupBytes={4} />
                  </dd>
                  <dt>Request</dt>
                  <dd className="whitespace-nowrap">
                    <Hex value={c.hex} />
                  </dd>
                </dl>
              </div>
            ))}
          </div>
        </div>
      </CardBody>
    </Card>
  );
}
