import { useState } from 'react';
import { Button } from '../../../components/button.tsx';
import { Card, CardBody, CardHeader } from '../../../components/card.tsx';
import { ErrorMessage } from '../../../components/error-message.tsx';
import { Select } from '../../../components/select.tsx';
import { Textarea } from '../../../components/textarea.tsx';
import type { Device } from '../../../../shared/api/index.ts';
import { useSourceDevices } from '../../../lib/api/get-devices.ts';

export type SourceLoaderProps = {
  onHex(hex: string): void;
  onDevice(device: Device): void;
  /** A reading error to show under the hex field. */
  hexError?: string;
};

/** Fill the form from a pasted Source_Capabilities message or a demo device. */
export function SourceLoader({ onHex, onDevice, hexError }: SourceLoaderProps) {
  const devices = useSourceDevices();
  const sources = (devices.data ?? []).filter((d) => d.pdos.length > 0);
  const [deviceId, setDeviceId] = useState('');
  const [hex, setHex] = useState('');
  const chosen = sources.find((d) => String(d.id) === deviceId);

  return (
    <Card aria-labelledby="source-loader-heading">
      <CardHeader title={<span id="source-loader-heading">Load a source</span>} description="Start from a demo device or a captured message, then edit the offers." />
      <CardBody className="space-y-4">
        <div className="flex flex-wrap items-end gap-2">
          <Select
            label="Demo device"
            className="min-w-64 flex-1"
            value={deviceId}
            onChange={(event) => setDeviceId(event.target.value)}
            options={[{ value: '', label: devices.isPending ? 'Loading…' : 'Choose a source' }, ...sources.map((d) => ({ value: String(d.id), label: `${d.name} (${d.pdpW} W)` }))]}
          />
          <Button variant="secondary" disabled={!chosen} onClick={() => chosen && onDevice(chosen)}>
            Load device
          </Button>
        </div>
        {devices.isError && <ErrorMessage title="The demo devices could not be loaded" error={devices.error} />}
        <form
          className="space-y-2"
          aria-label="Paste a message"
          onSubmit={(event) => {
            event.preventDefault();
            onHex(hex);
          }}
        >
          <Textarea
            label="Source_Capabilities message (hex)"
            mono
            rows={2}
            value={hex}
            onChange={(event) => setHex(event.target.value)}
            placeholder="a1 61 2c 91 01 00 …"
            hint="Header then objects, little-endian as on the wire; spaces, colons and 0x are fine."
            error={hexError}
          />
          <Button type="submit" variant="secondary" disabled={hex.trim() === ''}>
            Read message
          </Button>
        </form>
      </CardBody>
    </Card>
  );
}
