// biome-ignore-all lint/suspicious/noArrayIndexKey: read-only rows rendered whole, never reordered or edited; the position is the identity
import { Badge } from '../../../components/badge.tsx';
import { DataTable, dataColumnHelper } from '../../../components/data-table.tsx';
import { EmptyState } from '../../../components/empty-state.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Hex, Mono, RatingText } from '../../../components/mono.tsx';
import type { Device } from '../../../../shared/api/index.ts';
import { useDevices } from '../../../lib/api/get-devices.ts';
import { decodeSinkPdo, decodeSourcePdo, summarizeObject } from '../../../../shared/pd/index.ts';
import type { SourcePdo } from '../../../../shared/pd/types.ts';
import { describePdo } from '../../../../shared/rules/index.ts';

/** A PDO word in volts and amps ("fixed 9 V 3 A"), read as an offer (source) or a need (sink). */
export function pdoInWords(word: string, role: string): string {
  const raw = Number.parseInt(word.replace(/^0x/i, ''), 16);
  if (!Number.isFinite(raw)) return word;
  if (role === 'sink') return summarizeObject(decodeSinkPdo(raw));
  const pdo = decodeSourcePdo(raw);
  return pdo.kind === 'raw' ? word : describePdo(pdo as SourcePdo);
}

const col = dataColumnHelper<Device>();
const columns = col.columns([
  col.accessor('name', {
    header: 'Device',
    cell: ({ row }) => (
      <div className="min-w-40">
        <p className="font-medium text-slate-900 dark:text-slate-100">{row.original.name}</p>
        <p className="text-xs text-slate-500 dark:text-slate-400">{[row.original.maker, row.original.model].filter(Boolean).join(' · ')}</p>
      </div>
    ),
  }),
  col.accessor('role', {
    header: 'Role',
    cell: ({ getValue }) => (
      <Badge tone={getValue() === 'source' ? 'accent' : 'info'} mono>
        {getValue()}
      </Badge>
    ),
  }),
  col.accessor('pdpW', {
    header: 'PDP',
    meta: { align: 'end', mono: true },
    cell: ({ getValue }) => <Mono>{getValue()} W</Mono>,
  }),
  col.accessor('ratingLabel', {
    header: 'Rating label',
    enableSorting: false,
    meta: { mono: true },
    cell: ({ getValue }) => (getValue() ? <RatingText value={getValue()} /> : <span className="text-slate-400">—</span>),
  }),
  col.accessor('pdos', {
    header: 'Offers (object position order)',
    enableSorting: false,
    cell: ({ getValue, row }) => {
      const pdos = getValue();
      if (pdos.length === 0) return <span className="text-slate-400">—</span>;
      return (
        <ol className="flex max-w-80 flex-col gap-0.5" aria-label="Offers, object position order">
          {pdos.map((pdo, index) => (
            <li key={`${index}-${pdo}`} className="flex items-baseline gap-1.5" title={`PDO word ${pdo}`}>
              <span className="font-mono text-[10px] text-slate-400">{index + 1}</span>
              <span className="text-xs whitespace-nowrap text-slate-800 dark:text-slate-200">{pdoInWords(pdo, row.original.role)}</span>
              <Hex value={pdo} groupBytes={4} className="text-[10px] text-slate-400" />
            </li>
          ))}
        </ol>
      );
    },
  }),
  col.accessor('notes', {
    header: 'Notes',
    enableSorting: false,
    cell: ({ getValue }) => <p className="max-w-xs text-xs text-slate-600 dark:text-slate-400">{getValue()}</p>,
  }),
]);

const noDevices: Device[] = [];

/** The organisation's devices under test, as stored on the server. */
export function DevicesTable() {
  const devices = useDevices();
  if (devices.isError) return <ErrorMessage title="The devices could not be loaded" error={devices.error} />;
  return (
    <DataTable
      label="Devices under test"
      columns={columns}
      data={devices.data?.items ?? noDevices}
      getRowId={(device) => String(device.id)}
      isLoading={devices.isPending}
      initialSorting={[{ id: 'name', desc: false }]}
      empty={<EmptyState title="No devices yet" description="Devices under test appear here once someone adds them." />}
    />
  );
}
