/** The fields of each vector kind (docs/vector.md's table). */
import { useMemo, useState } from 'react';
import { CodeEditor } from '../../../components/code-editor.tsx';
import { Mono, RatingText } from '../../../components/mono.tsx';
import { Select } from '../../../components/select.tsx';
import { defaultPolicy, policyFields, policyKindHelp, policyKindOptions, type PolicyKind } from '../../../lib/offers-form/policy-fields.ts';
import { scenarioJsonSchema, traceJsonSchema } from '../../../../shared/vectors/schema.ts';
import { getIn, type Path, type VectorObject } from '../lib/vector-model.ts';
import { OfferListEditor } from '../../../components/offer-list-editor.tsx';
import { buildOffers, defaultOffer, offerInputOf, offerListSchema, type OfferInput } from '../../../../shared/rules/offer-input.ts';
import { isPadding } from '../../../../shared/rules/pdo-facts.ts';
import { readCapsHex, readPdoList } from '../../../../shared/rules/read-caps.ts';
import { Checkbox } from '../../../components/checkbox.tsx';
import { JsonArea, ListInput, NumberInput, TextInput } from './form-controls.tsx';

export type FieldsProps = { v: VectorObject; set: (path: Path, value: unknown) => void; disabled?: boolean };

const sopOptions = [{ value: '', label: 'SOP (default)' }, ...["SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"].map((s) => ({ value: s, label: s }))];
// The DC symbol (U+2393) as on a printed label; the page font has no glyph for it, so RatingText draws it.
const exampleRating = '5V\u23933A 9V\u23933A 15V\u23933A 45W max';
const ratingText = 'font-mono text-slate-700 dark:text-slate-300';

const cableOptions = [
  { value: '', label: 'Not given' },
  { value: '3000', label: '3 A cable' },
  { value: '5000', label: '5 A cable' },
];

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <fieldset className="grid gap-3 rounded-md border border-slate-200 p-3 sm:grid-cols-2 dark:border-slate-800">
      <legend className="px-1 text-[11px] font-semibold tracking-wide text-slate-500 uppercase dark:text-slate-400">{title}</legend>
      {children}
    </fieldset>
  );
}

function FindingsFields({ v, set, disabled, path = ['expect', 'findings'] }: FieldsProps & { path?: Path }) {
  return (
    <>
      <ListInput label="Findings that must appear" disabled={disabled} value={getIn(v, [...path, 'include'])} onChange={(x) => set([...path, 'include'], x)} placeholder="caps.power-rules-missing" />
      <ListInput
        label="Findings that must not appear"
        hint='Rule ids; "*error" means no error at all.'
        disabled={disabled}
        value={getIn(v, [...path, 'exclude'])}
        onChange={(x) => set([...path, 'exclude'], x)}
        placeholder="*error"
      />
    </>
  );
}

type OffersRead = { offers: OfferInput[]; words: string[] } | { error: string } | null;

/** The vector's offers as the editor shows them, with the word each came from; null when it gives none. */
function offersOfVector(pdos: unknown, hex: unknown): OffersRead {
  const read = Array.isArray(pdos) && pdos.length > 0 ? readPdoList(pdos as string[]) : typeof hex === 'string' && hex.trim() !== '' ? readCapsHex(hex, 'message') : null;
  if (read === null) return null;
  if (!read.ok) return { error: read.error.message };
  const kept = read.pdos.filter((pdo) => !isPadding(pdo));
  return { offers: kept.map(offerInputOf), words: kept.map((pdo) => pdo.raw) };
}

const sameOffer = (a: OfferInput | undefined, b: OfferInput | undefined) => a !== undefined && b !== undefined && JSON.stringify(a) === JSON.stringify(b);

/**
 * The Offers page's editor over a vector's `input.pdos`: each change that reads writes the list
 * of words (an offer left as it was keeps its word, flags included) and drops the message hex.
 */
function OffersEditorField({ v, set, disabled, hexKey }: FieldsProps & { hexKey: 'hex' | 'caps' }) {
  const input = getIn(v, ['input']);
  const pdos = getIn(v, ['input', 'pdos']);
  const hex = getIn(v, ['input', hexKey]);
  const read = useMemo(() => offersOfVector(pdos, hex), [pdos, hex]);
  const canonical = read !== null && 'offers' in read ? read.offers : [defaultOffer('fixed')];
  const canonicalKey = JSON.stringify(canonical);
  const [draft, setDraft] = useState<OfferInput[]>(canonical);
  const [seen, setSeen] = useState(canonicalKey);
  if (canonicalKey !== seen) {
    // Changed elsewhere (the hex list, the JSON editor): follow unless the draft already means it.
    setSeen(canonicalKey);
    if (JSON.stringify(draft) !== canonicalKey) setDraft(canonical);
  }
  const parsed = offerListSchema.safeParse(draft);
  const issues = parsed.success ? [] : parsed.error.issues;
  const issueAt = (index: number, field: string) => issues.find((issue) => issue.path[0] === index && issue.path[1] === field)?.message;
  const listIssue = issues.find((issue) => issue.path.length === 0)?.message;
  const onChange = (next: OfferInput[]) => {
    setDraft(next);
    const built = buildOffers(next);
    if (!built.ok) return; // the fields show why
    const before = read !== null && 'offers' in read ? read : { offers: [], words: [] };
    const words = built.pdos.map((pdo, index) => (sameOffer(next[index], before.offers[index]) ? before.words[index]! : pdo.raw));
    const base = typeof input === 'object' && input !== null ? (input as Record<string, unknown>) : {};
    set(['input'], { ...base, pdos: words, [hexKey]: undefined });
  };
  return (
    <div className="flex flex-col gap-1.5 sm:col-span-2">
      <span className="text-xs font-medium text-slate-700 dark:text-slate-300">Offers</span>
      <p className="text-xs text-slate-500 dark:text-slate-400">
        The source's offers in object-position order (voltages in mV, currents in mA). A change writes the PDO words below; an offer you leave as it was keeps its word and flags.
      </p>
      {read !== null && 'error' in read && (
        <p role="alert" className="text-xs font-medium text-red-600 dark:text-red-400">
          The offers cannot be read from this vector ({read.error}); edit them here to write new PDO words.
        </p>
      )}
      <OfferListEditor offers={draft} onChange={onChange} disabled={disabled} errorOf={issueAt} listError={listIssue} />
    </div>
  );
}

function CapsSource({ v, set, disabled, hexKey }: FieldsProps & { hexKey: 'hex' | 'caps' }) {
  return (
    <>
      <OffersEditorField v={v} set={set} disabled={disabled} hexKey={hexKey} />
      <ListInput
        label="PDOs (32-bit hex)"
        className="sm:col-span-2"
        hint="The offers as words, e.g. 0x0001912c (the editor above writes them); or give the message hex instead."
        disabled={disabled}
        value={getIn(v, ['input', 'pdos'])}
        onChange={(x) => set(['input', 'pdos'], x)}
      />
      <TextInput label="Source_Capabilities message (hex)" className="sm:col-span-2" mono disabled={disabled} value={getIn(v, ['input', hexKey])} onChange={(x) => set(['input', hexKey], x)} />
    </>
  );
}

function CableSelect({ v, set, disabled }: FieldsProps) {
  const value = getIn(v, ['input', 'cableMa']);
  return (
    <Select
      label="Cable rating"
      disabled={disabled}
      options={cableOptions}
      value={typeof value === 'number' ? String(value) : ''}
      onChange={(e) => set(['input', 'cableMa'], e.target.value === '' ? undefined : Number(e.target.value))}
    />
  );
}

function DecodeFields(props: FieldsProps) {
  const { v, set, disabled } = props;
  return (
    <>
      <Section title="Input">
        <TextInput
          label="Message (hex)"
          mono
          className="sm:col-span-2"
          disabled={disabled}
          value={getIn(v, ['input', 'hex'])}
          onChange={(x) => set(['input', 'hex'], x)}
          placeholder="a1 61 2c 91 01 08"
        />
        <Select label="SOP" disabled={disabled} options={sopOptions} value={String(getIn(v, ['input', 'sop']) ?? '')} onChange={(e) => set(['input', 'sop'], e.target.value || undefined)} />
        <TextInput
          label="Caps in force (hex)"
          hint="The Source_Capabilities a Request refers to."
          mono
          disabled={disabled}
          value={getIn(v, ['input', 'caps'])}
          onChange={(x) => set(['input', 'caps'], x)}
        />
        <Checkbox
          label="Words: a 16-bit header then 32-bit objects as numbers"
          disabled={disabled}
          checked={getIn(v, ['input', 'words']) === true}
          onChange={(event) => set(['input', 'words'], event.target.checked || undefined)}
        />
        <Checkbox
          label="The last 4 bytes are the CRC-32"
          disabled={disabled}
          checked={getIn(v, ['input', 'crc']) === true}
          onChange={(event) => set(['input', 'crc'], event.target.checked || undefined)}
        />
      </Section>
      <Section title="Expected">
        <TextInput
          label="Message type"
          disabled={disabled}
          value={getIn(v, ['expect', 'message', 'header', 'messageType'])}
          onChange={(x) => set(['expect', 'message', 'header', 'messageType'], x)}
          placeholder="Source_Capabilities"
        />
        <TextInput label="Error code (when decoding must fail)" mono disabled={disabled} value={getIn(v, ['expect', 'error'])} onChange={(x) => set(['expect', 'error'], x)} />
        <JsonArea
          label="Expected message fields (partial Message, JSON)"
          className="sm:col-span-2"
          rows={6}
          disabled={disabled}
          value={getIn(v, ['expect', 'message'])}
          onChange={(x) => set(['expect', 'message'], x)}
        />
      </Section>
    </>
  );
}

function EncodeFields({ v, set, disabled }: FieldsProps) {
  return (
    <>
      <Section title="Input">
        <JsonArea
          label="Message (JSON, as decode prints it; raw fields may be left out)"
          className="sm:col-span-2"
          rows={8}
          disabled={disabled}
          value={getIn(v, ['input', 'message'])}
          onChange={(x) => set(['input', 'message'], x)}
        />
      </Section>
      <Section title="Expected">
        <TextInput label="Wire hex" mono className="sm:col-span-2" disabled={disabled} value={getIn(v, ['expect', 'hex'])} onChange={(x) => set(['expect', 'hex'], x)} />
      </Section>
    </>
  );
}

function CapsFields(props: FieldsProps) {
  const { v, set, disabled } = props;
  return (
    <>
      <Section title="Input">
        <CapsSource {...props} hexKey="hex" />
        <NumberInput label="Declared PDP (W)" disabled={disabled} value={getIn(v, ['input', 'pdpW'])} onChange={(x) => set(['input', 'pdpW'], x)} />
        <CableSelect {...props} />
        <PrintedLabel {...props} />
      </Section>
      <Section title="Expected">
        <FindingsFields {...props} />
        <NumberInput label="PDP (W)" disabled={disabled} value={getIn(v, ['expect', 'pdpW'])} onChange={(x) => set(['expect', 'pdpW'], x)} />
      </Section>
    </>
  );
}

/** An input draws the text in the page font, which has no DC symbol: the hint shows it rendered. */
function PrintedLabel({ v, set, disabled }: FieldsProps) {
  const value = getIn(v, ['input', 'label']);
  const rating = typeof value === 'string' ? value : '';
  return (
    <TextInput
      label="Printed rating label"
      className="sm:col-span-2"
      disabled={disabled}
      value={value}
      onChange={(x) => set(['input', 'label'], x)}
      placeholder="As printed on the adapter"
      hint={
        rating.trim() === '' ? (
          <>
            For example <RatingText value={exampleRating} className={ratingText} />
          </>
        ) : (
          <>
            As printed: <RatingText value={rating} className={ratingText} />
          </>
        )
      }
    />
  );
}

const isPolicyKind = (kind: unknown): kind is PolicyKind => policyKindOptions.some((option) => option.value === kind);

/** The sink policy as on the Bench and Offers pages: the kind with a line of help, then its numbers. */
function SinkPolicyFields({ v, set, disabled, path }: FieldsProps & { path: Path }) {
  const stored = getIn(v, [...path, 'kind']);
  const kind: PolicyKind = isPolicyKind(stored) ? stored : 'max-power';
  return (
    <>
      <Select
        label="Sink policy"
        disabled={disabled}
        options={policyKindOptions}
        value={kind}
        hint={
          <>
            <Mono>{kind}</Mono> · {policyKindHelp[kind]}
          </>
        }
        onChange={(e) => set(path, defaultPolicy(e.target.value as PolicyKind))}
      />
      {policyFields[kind].map(({ name, label }) => (
        <NumberInput key={`${kind}-${name}`} label={label} disabled={disabled} value={getIn(v, [...path, name])} onChange={(x) => set([...path, name], x)} />
      ))}
    </>
  );
}

function RequestFields(props: FieldsProps) {
  const { v, set, disabled } = props;
  return (
    <>
      <Section title="Input">
        <CapsSource {...props} hexKey="caps" />
        <SinkPolicyFields {...props} path={['input', 'sink']} />
        <CableSelect {...props} />
      </Section>
      <Section title="Expected request">
        <NumberInput label="Object position" disabled={disabled} value={getIn(v, ['expect', 'request', 'objectPosition'])} onChange={(x) => set(['expect', 'request', 'objectPosition'], x)} />
        <Select
          label="Capability Mismatch"
          disabled={disabled}
          options={[
            { value: '', label: 'Not checked' },
            { value: 'false', label: 'Clear' },
            { value: 'true', label: 'Set' },
          ]}
          value={String(getIn(v, ['expect', 'request', 'capabilityMismatch']) ?? '')}
          onChange={(e) => set(['expect', 'request', 'capabilityMismatch'], e.target.value === '' ? undefined : e.target.value === 'true')}
        />
        <JsonArea
          label="Expected request (partial, as parley request prints it)"
          className="sm:col-span-2"
          rows={6}
          disabled={disabled}
          value={getIn(v, ['expect', 'request'])}
          onChange={(x) => set(['expect', 'request'], x)}
        />
      </Section>
    </>
  );
}

/** JSON in Monaco with a schema; the vector changes only while it parses. */
function JsonEditorField({
  label,
  path,
  schema,
  value,
  onChange,
  disabled,
  height = '16rem',
}: {
  label: string;
  path: string;
  schema: object;
  value: unknown;
  onChange: (next: unknown) => void;
  disabled?: boolean;
  height?: string;
}) {
  const canonical = JSON.stringify(value ?? null, null, 2);
  const [draft, setDraft] = useState(canonical);
  const [seen, setSeen] = useState(canonical);
  const [error, setError] = useState<string | null>(null);
  if (canonical !== seen) {
    setSeen(canonical);
    let same = false;
    try {
      same = JSON.stringify(JSON.parse(draft), null, 2) === canonical;
    } catch {
      same = false;
    }
    if (!same) setDraft(canonical);
  }
  return (
    <div className="flex flex-col gap-1.5 sm:col-span-2">
      <span className="text-xs font-medium text-slate-700 dark:text-slate-300">{label}</span>
      <CodeEditor
        language="json"
        label={label}
        path={path}
        jsonSchema={schema}
        readOnly={disabled}
        height={height}
        value={draft}
        onChange={(text) => {
          setDraft(text);
          try {
            onChange(JSON.parse(text) as unknown);
            setError(null);
          } catch {
            setError('Not JSON yet: the vector keeps the last value that read.');
          }
        }}
      />
      {error && <p className="text-xs text-orange-700 dark:text-orange-300">{error}</p>}
    </div>
  );
}

function NegotiationFields(props: FieldsProps) {
  const { v, set, disabled } = props;
  const schema = useMemo(() => scenarioJsonSchema(), []);
  const noContract = getIn(v, ['expect', 'contract']) === null;
  return (
    <>
      <Section title="Scenario">
        <JsonEditorField
          label="Scenario (JSON)"
          path="vector-scenario.json"
          schema={schema}
          disabled={disabled}
          value={getIn(v, ['input', 'scenario'])}
          onChange={(x) => set(['input', 'scenario'], x)}
        />
      </Section>
      <Section title="Expected">
        <Checkbox label="No contract at the end" disabled={disabled} checked={noContract} onChange={(event) => set(['expect', 'contract'], event.target.checked ? null : undefined)} />
        <NumberInput label="Contract within (ms)" disabled={disabled} value={getIn(v, ['expect', 'contractWithinMs'])} onChange={(x) => set(['expect', 'contractWithinMs'], x)} />
        {!noContract && (
          <JsonArea label="Contract (partial, JSON)" className="sm:col-span-2" rows={4} disabled={disabled} value={getIn(v, ['expect', 'contract'])} onChange={(x) => set(['expect', 'contract'], x)} />
        )}
        <ListInput label="Message sequence (in this order)" className="sm:col-span-2" disabled={disabled} value={getIn(v, ['expect', 'sequence'])} onChange={(x) => set(['expect', 'sequence'], x)} />
        <FindingsFields {...props} />
      </Section>
    </>
  );
}

function TraceFields(props: FieldsProps) {
  const { v, set, disabled } = props;
  const schema = useMemo(() => ({ type: 'array', items: traceJsonSchema() }), []);
  const usesFile = getIn(v, ['input', 'file']) !== undefined;
  return (
    <>
      <Section title="Input">
        <Select
          label="Records"
          disabled={disabled}
          options={[
            { value: 'inline', label: 'In the vector' },
            { value: 'file', label: 'A file beside the vector' },
          ]}
          value={usesFile ? 'file' : 'inline'}
          onChange={(e) => set(['input'], e.target.value === 'file' ? { file: 'capture.trace.jsonl' } : { trace: [] })}
        />
        {usesFile ? (
          <TextInput label="File (relative to the vector file)" mono disabled={disabled} value={getIn(v, ['input', 'file'])} onChange={(x) => set(['input', 'file'], x ?? '')} />
        ) : (
          <JsonEditorField
            label="Trace records (JSON)"
            path="vector-trace.json"
            schema={schema}
            disabled={disabled}
            value={getIn(v, ['input', 'trace'])}
            onChange={(x) => set(['input', 'trace'], x)}
          />
        )}
      </Section>
      <Section title="Expected">
        <NumberInput label="Messages" disabled={disabled} value={getIn(v, ['expect', 'messages'])} onChange={(x) => set(['expect', 'messages'], x)} />
        <FindingsFields {...props} />
        <JsonArea
          label="Contracts (partial, by index, JSON)"
          className="sm:col-span-2"
          rows={4}
          disabled={disabled}
          value={getIn(v, ['expect', 'contracts'])}
          onChange={(x) => set(['expect', 'contracts'], x)}
        />
      </Section>
    </>
  );
}

function PropertyFields({ v, set, disabled }: FieldsProps) {
  const code = getIn(v, ['input', 'code']);
  return (
    <>
      <Section title="Property">
        <div className="flex flex-col gap-1.5 sm:col-span-2">
          <span className="text-xs font-medium text-slate-700 dark:text-slate-300">Code (TypeScript: export default ({'{ fc, engine }'}) =&gt; fc.property(…))</span>
          <CodeEditor
            language="typescript"
            label="Property code"
            path="vector-property.ts"
            readOnly={disabled}
            height="14rem"
            value={typeof code === 'string' ? code : ''}
            onChange={(x) => set(['input', 'code'], x)}
          />
        </div>
        <NumberInput label="Runs" disabled={disabled} value={getIn(v, ['input', 'runs'])} onChange={(x) => set(['input', 'runs'], x)} />
        <NumberInput label="Seed" disabled={disabled} value={getIn(v, ['input', 'seed'])} onChange={(x) => set(['input', 'seed'], x)} />
      </Section>
      <Section title="Expected">
        <Checkbox label="The property holds" disabled={disabled} checked={getIn(v, ['expect', 'holds']) !== false} onChange={(event) => set(['expect', 'holds'], event.target.checked)} />
      </Section>
    </>
  );
}

export function KindFields(props: FieldsProps) {
  switch (props.v.kind) {
    case 'decode':
      return <DecodeFields {...props} />;
    case 'encode':
      return <EncodeFields {...props} />;
    case 'caps':
      return <CapsFields {...props} />;
    case 'request':
      return <RequestFields {...props} />;
    case 'negotiation':
      return <NegotiationFields {...props} />;
    case 'trace':
      return <TraceFields {...props} />;
    case 'property':
      return <PropertyFields {...props} />;
    default:
      return <p className="text-sm text-slate-500">Choose a kind to see its fields.</p>;
  }
}
