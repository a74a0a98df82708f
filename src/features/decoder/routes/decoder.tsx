import { useEffect, useState } from 'react';
import { useSearchParams } from 'react-router';
import type { DecoderInput, Sop } from '../../../../shared/pd/index.ts';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { Checkbox } from '../../../components/checkbox.tsx';
import { Input } from '../../../components/input.tsx';
import { PageHeader } from '../../../components/page-header.tsx';
import { Select } from '../../../components/select.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import { useDecoded } from '../api/codec-worker.ts';
import { DecodeError } from '../components/decode-error.tsx';
import { MessageView } from '../components/message-view.tsx';
import { VcdDrop } from '../components/vcd-drop.tsx';
import { inputFromSearch, searchFromInput } from '../lib/search-params.ts';

const SOP_OPTIONS = ['SOP', "SOP'", "SOP''", "SOP'_Debug", "SOP''_Debug"].map((value) => ({ value, label: value }));
const MODE_OPTIONS = [
  { value: 'bytes', label: 'Bytes as on the wire (little-endian)' },
  { value: 'words', label: 'Words: 16-bit header, 32-bit objects' },
];
// Kestrel Devices' demo charger: 5 V 3 A (unconstrained), 9/12/15 V 3 A, 20 V 3.25 A, PPS 3.3–11 V 3 A.
const EXAMPLE = 'a1 61 2c 91 01 08 2c d1 02 00 2c c1 03 00 2c b1 04 00 45 41 06 00 3c 21 dc c0';

/** Paste a message (or drop a capture) and read it field by field; the input lives in the URL. */
export function DecoderRoute() {
  const [search, setSearch] = useSearchParams();
  const [input, setInput] = useState<DecoderInput>(() => inputFromSearch(search));
  const decoded = useDecoded(input);

  // Keep the URL in step (replace, not push: typing should not fill the history).
  useEffect(() => {
    const next = searchFromInput(input).toString();
    if (next !== search.toString()) setSearch(new URLSearchParams(next), { replace: true });
  }, [input, search, setSearch]);

  const update = (patch: Partial<DecoderInput>) => setInput((current) => ({ ...current, ...patch }));
  const isRequest = decoded.status === 'done' && decoded.outcome.ok && decoded.outcome.message.header.messageType.endsWith('Request');

  return (
    <>
      <PageHeader
        eyebrow="Analyse"
        title="Decoder"
        description="Paste one USB PD message as bytes or words and read every field, bit by bit, with the specification table it comes from. The link in the address bar reproduces this decode."
      />
      <div className="grid items-start gap-6 xl:grid-cols-[24rem_minmax(0,1fr)]">
        <div className="space-y-6">
          <Card>
            <CardHeader
              title="Message"
              description={
                <button type="button" className="underline decoration-dotted" onClick={() => update({ text: EXAMPLE, mode: 'bytes' })}>
                  Load an example Source_Capabilities
                </button>
              }
            />
            <CardBody className="space-y-4">
              <Textarea
                label="Message"
                mono
                rows={4}
                value={input.text}
                placeholder={input.mode === 'words' ? '0x1082 0x1304b12c' : 'a1 61 2c 91 01 08 …'}
                hint={input.mode === 'words' ? 'The header as a 16-bit number, then each object as a 32-bit number.' : 'Hex bytes in wire order, with or without 0x, spaces or colons.'}
                onChange={(event) => update({ text: event.target.value })}
                spellCheck={false}
              />
              <Select label="Input is" options={MODE_OPTIONS} value={input.mode} onChange={(event) => update({ mode: event.target.value === 'words' ? 'words' : 'bytes' })} />
              <div className="grid grid-cols-2 items-end gap-3">
                <Select label="Sent on" options={SOP_OPTIONS} value={input.sop} onChange={(event) => update({ sop: event.target.value as Sop })} />
                <Checkbox label="Ends with the CRC-32" className="h-9" checked={input.crc} onChange={(event) => update({ crc: event.target.checked })} />
              </div>
              <Input
                label="Source_Capabilities for a Request (optional)"
                mono
                value={input.caps}
                placeholder="hex of the offers the Request refers to"
                hint={isRequest && !input.caps ? 'Give the offers so the request is read by the type of the offer it names.' : undefined}
                onChange={(event) => update({ caps: event.target.value })}
                spellCheck={false}
              />
            </CardBody>
          </Card>
          <Card>
            <CardHeader title="Capture" description="A CC-line waveform in VCD form, as a logic analyser saves it." />
            <CardBody>
              <VcdDrop onPick={(entry) => update({ text: entry.hex, mode: 'bytes', sop: entry.sop, crc: false })} />
            </CardBody>
          </Card>
          <p className="text-xs text-slate-500 dark:text-slate-400">
            Parley decodes and simulates; it does not drive hardware. Real adapters deliver up to 48 V and 5 A: when you probe one, defer to the USB PD specification, certified test labs and your
            local electrical codes.
          </p>
        </div>
        <section aria-label="Decoded message" aria-busy={decoded.status === 'pending'}>
          {decoded.status === 'idle' && (
            <p className="rounded-lg border border-dashed border-slate-300 px-4 py-10 text-center text-sm text-slate-500 dark:border-slate-700">Paste a message to decode it.</p>
          )}
          {decoded.status === 'pending' && <p className="text-sm text-slate-500">Decoding…</p>}
          {decoded.status === 'failed' && (
            <p role="alert" className="text-sm text-red-700">
              The decoder stopped: {decoded.message}
            </p>
          )}
          {decoded.status === 'done' &&
            (decoded.outcome.ok ? (
              <MessageView message={decoded.outcome.message} warnings={decoded.outcome.warnings} hex={decoded.outcome.hex} />
            ) : (
              <DecodeError failure={decoded.outcome} text={input.text} caps={input.caps} />
            ))}
        </section>
      </div>
    </>
  );
}
