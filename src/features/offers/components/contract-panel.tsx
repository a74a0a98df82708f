import { Badge } from '../../../components/badge.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Input } from '../../../components/input.tsx';
import { Hex, Mono } from '../../../components/mono.tsx';
import { Select } from '../../../components/select.tsx';
import { numberFromInput, numberInputText } from '../../../lib/offers-form/offer-fields.ts';
import { defaultPolicy, policyFields, policyKindHelp, policyKindOptions, type PolicyKind } from '../../../lib/offers-form/policy-fields.ts';
import type { SinkPolicy } from '../../../../shared/rules/sink-policy.ts';
import type { CableContract } from '../../../../shared/rules/analyse-offers.ts';

/** The page starts with the sink that takes the most power, as the Bench does. */
export const initialPolicy: SinkPolicy = defaultPolicy('max-power');

export type ContractPanelProps = {
  /** The policy as the engine reads it (vector.md); a number is NaN while its field is empty. */
  policy: SinkPolicy;
  onPolicy(policy: SinkPolicy): void;
  contracts: readonly CableContract[];
  error?: string;
};

/** A sink policy and the contract it takes over a 3 A and a 5 A cable, with the Request it sends. */
export function ContractPanel({ policy, onPolicy, contracts, error }: ContractPanelProps) {
  return (
    <Card aria-labelledby="contract-heading">
      <CardHeader title={<span id="contract-heading">Contract</span>} description="What a sink with this policy requests, and the contract it gets." />
      <CardBody className="space-y-4">
        <div className="flex flex-wrap items-start gap-3">
          <Select
            label="Sink policy"
            className="w-full"
            options={policyKindOptions}
            value={policy.kind}
            hint={
              <>
                <Mono>{policy.kind}</Mono> · {policyKindHelp[policy.kind]}
              </>
            }
            onChange={(event) => onPolicy(defaultPolicy(event.target.value as PolicyKind))}
          />
          {policyFields[policy.kind].map(({ name, label, step }) => (
            <Input
              key={`${policy.kind}-${name}`}
              label={label}
              type="number"
              min={0}
              step={step}
              mono
              className="w-36"
              value={numberInputText((policy as Record<string, unknown>)[name])}
              onChange={(event) => onPolicy({ ...policy, [name]: numberFromInput(event.target.value) } as SinkPolicy)}
            />
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
