/**
 * Builders for source PDOs from the few numbers people think in (used by the tests, the property
 * generators and the Offers form). Each returns the decoded form with a `raw` that encodes it, so
 * the object is exactly what a decoder would produce. Throws RangeError on a value the PDO cannot
 * hold (the codec's guards), e.g. 5_001 mV for a 50 mV field.
 */
import { decodeSourcePdo, encodeSourcePdo, hex32 } from '../pd/index.ts';
import type { BatterySourcePdo, EprAvsApdo, FixedSourcePdo, PpsApdo, SourcePdo, SprAvsApdo, VariableSourcePdo } from '../pd/types.ts';

type FixedFlags = Partial<Omit<FixedSourcePdo, 'kind' | 'raw' | 'voltageMv' | 'maxCurrentMa'>>;

function withRaw<T extends SourcePdo>(pdo: T): T {
  const raw = encodeSourcePdo(pdo);
  const decoded = decodeSourcePdo(raw);
  if (decoded.kind !== pdo.kind) throw new RangeError(`kind: ${pdo.kind} did not survive encoding`);
  return { ...pdo, raw: hex32(raw) };
}

export function fixedPdo(voltageMv: number, maxCurrentMa: number, flags: FixedFlags = {}): FixedSourcePdo {
  return withRaw({
    kind: 'fixed',
    raw: '',
    voltageMv,
    maxCurrentMa,
    peakCurrent: 0,
    dualRolePower: false,
    usbSuspendSupported: false,
    unconstrainedPower: false,
    usbCommunicationsCapable: false,
    dualRoleData: false,
    unchunkedExtendedMessages: false,
    eprModeCapable: false,
    ...flags,
  });
}

export function variablePdo(minVoltageMv: number, maxVoltageMv: number, maxCurrentMa: number): VariableSourcePdo {
  return withRaw({ kind: 'variable', raw: '', minVoltageMv, maxVoltageMv, maxCurrentMa });
}

export function batteryPdo(minVoltageMv: number, maxVoltageMv: number, maxPowerMw: number): BatterySourcePdo {
  return withRaw({ kind: 'battery', raw: '', minVoltageMv, maxVoltageMv, maxPowerMw });
}

export function ppsApdo(minVoltageMv: number, maxVoltageMv: number, maxCurrentMa: number, powerLimited = false): PpsApdo {
  return withRaw({ kind: 'pps', raw: '', minVoltageMv, maxVoltageMv, maxCurrentMa, powerLimited });
}

export function eprAvsApdo(minVoltageMv: number, maxVoltageMv: number, pdpW: number, peakCurrent = 0): EprAvsApdo {
  return withRaw({ kind: 'epr-avs', raw: '', minVoltageMv, maxVoltageMv, pdpW, peakCurrent });
}

export function sprAvsApdo(maxCurrent15vMa: number, maxCurrent20vMa: number, peakCurrent = 0): SprAvsApdo {
  return withRaw({ kind: 'spr-avs', raw: '', maxCurrent15vMa, maxCurrent20vMa, peakCurrent });
}

/** The all-zero object EPR_Source_Capabilities puts in unused SPR positions. */
export function paddingPdo(): FixedSourcePdo {
  return { ...fixedPdo(0, 0), raw: '0x00000000' };
}
