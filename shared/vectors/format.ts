/**
 * Byte-stable serialisation of vector files (docs/vector.md): import then export gives
 * the same bytes, and `formatVector(v) === formatVector(JSON.parse(formatVector(v)))`.
 *
 * The layout:
 * - two-space indent, `": "` after a key, a final newline; no trailing spaces;
 * - an array whose elements are all scalars (strings, numbers, booleans, null) is written on one
 *   line, `["0x0001912c", "0x0002d12c"]`; other arrays one element a line; `[]` and `{}` when empty;
 * - object keys in a fixed order, the same at every depth: first the keys of `KEY_ORDER` in that
 *   order, then any other keys in code-point order. `KEY_ORDER` is the top of a vector file
 *   (vector.md), then input and expect keys, then the Scenario (vector.md), then Message and
 *   DataObject fields (objects.md), Finding (rules.md), Contract (cli.md) and trace records
 *   (trace.md), each in the order its contract page lists them. A key appears once in the list (at
 *   its first place: `ref` and `message` of a Finding sort where the vector file has them), so the
 *   order never depends on where an object sits.
 */

export const KEY_ORDER: readonly string[] = [
  // vector file
  'vector',
  'id',
  'title',
  'tags',
  'ref',
  'kind',
  'input',
  'expect',
  // input / expect of the kinds
  'hex',
  'words',
  'caps',
  'pdos',
  'pdpW',
  'cableMa',
  'label',
  'sink',
  'scenario',
  'trace',
  'file',
  'code',
  'runs',
  'seed',
  'message',
  'error',
  'request',
  'contract',
  'sequence',
  'findings',
  'include',
  'exclude',
  'contractWithinMs',
  'contracts',
  'messages',
  'holds',
  // scenario
  'source',
  'specRevision',
  'behaviour',
  'capsIntervalMs',
  'policy',
  'changes',
  'atMs',
  'cable',
  'currentRatingMa',
  'resistanceMohm',
  'faults',
  'from',
  'messageType',
  'nth',
  'delayMs',
  'durationMs',
  // sink policies
  'minVoltageMv',
  'maxVoltageMv',
  'voltageMv',
  'currentMa',
  'powerMw',
  // Message (objects.md)
  'sop',
  'header',
  'raw',
  'category',
  'numDataObjects',
  'messageId',
  'powerRole',
  'dataRole',
  'cablePlug',
  'extended',
  'extendedHeader',
  'chunked',
  'chunkNumber',
  'requestChunk',
  'dataSize',
  'objects',
  'payload',
  'crc',
  'value',
  'ok',
  // DataObject fields (objects.md)
  'maxCurrentMa',
  'operationalCurrentMa',
  'maxPowerMw',
  'operationalPowerMw',
  'peakCurrent',
  'dualRolePower',
  'higherCapability',
  'usbSuspendSupported',
  'unconstrainedPower',
  'usbCommunicationsCapable',
  'dualRoleData',
  'unchunkedExtendedMessages',
  'eprModeCapable',
  'frSwapRequiredCurrent',
  'powerLimited',
  'maxCurrent15vMa',
  'maxCurrent20vMa',
  'objectPosition',
  'outputVoltageMv',
  'operatingCurrentMa',
  'maxOperatingCurrentMa',
  'operatingPowerMw',
  'maxOperatingPowerMw',
  'giveBack',
  'capabilityMismatch',
  'noUsbSuspend',
  'rdo',
  // Finding (rules.md), Contract (cli.md)
  'rule',
  'severity',
  't',
  'line',
  'object',
  // trace records (trace.md)
  'msg',
  'crcOk',
  'event',
  'cc',
  'rp',
  'vbus',
  'mv',
  'ma',
  'note',
];

const RANK = new Map(KEY_ORDER.map((key, index) => [key, index]));

function compareKeys(a: string, b: string): number {
  const ra = RANK.get(a);
  const rb = RANK.get(b);
  if (ra !== undefined && rb !== undefined) return ra - rb;
  if (ra !== undefined) return -1;
  if (rb !== undefined) return 1;
  return a < b ? -1 : a > b ? 1 : 0;
}

function isScalar(value: unknown): boolean {
  return value === null || typeof value !== 'object';
}

function write(value: unknown, indent: string): string {
  if (value === undefined) return 'null';
  if (isScalar(value)) return JSON.stringify(value) ?? 'null';
  const inner = `${indent}  `;
  if (Array.isArray(value)) {
    if (value.length === 0) return '[]';
    if (value.every(isScalar)) return `[${value.map((v) => JSON.stringify(v) ?? 'null').join(', ')}]`;
    return `[\n${value.map((v) => inner + write(v, inner)).join(',\n')}\n${indent}]`;
  }
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => compareKeys(a, b));
  if (entries.length === 0) return '{}';
  return `{\n${entries.map(([k, v]) => `${inner}${JSON.stringify(k)}: ${write(v, inner)}`).join(',\n')}\n${indent}}`;
}

/** The file text of a vector (or any JSON value) in the stable layout above, with a final newline. */
export function formatVector(value: unknown): string {
  return `${write(value, '')}\n`;
}
