import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeDataBlock, encodeDataBlock } from './extended-data.ts';

const bytes = (hex: string) => Uint8Array.from(hex.match(/../g) ?? [], (b) => parseInt(b, 16));
const hex = (b: Uint8Array) => Array.from(b, (x) => x.toString(16).padStart(2, '0')).join('');
const roundTrip = (type: string, block: string) => expect(hex(encodeDataBlock(type, decodeDataBlock(type, bytes(block))!))).toBe(block);

// Data blocks of extended messages, USB PD R3.1 V1.8 / R3.2 V1.1 §6.5 (little-endian fields; the
// bit meanings of the packed bytes are from memory, see extended-data.ts).
describe('extended data blocks', () => {
  it('Status (§6.5.2): Present Input, Event Flags, Temperature Status, Power Status and Power State Change read bit by bit', () => {
    // 45 °C; external AC power (B1, B2); no batteries; OTP (B2); temperature warning (B2..1 = 10b);
    // power limited by temperature (B5); new power state S0 (001b) with its indicator on (B5..3 = 001b).
    const data = decodeDataBlock('Status', bytes('2d06000404200' + '9'));
    expect(data).toMatchObject({
      internalTempC: 45,
      presentInputFlags: { externalPower: true, externalPowerAc: true, internalPowerFromBattery: false, internalPowerFromNonBattery: false },
      eventFlagsFlags: { ocp: false, otp: true, ovp: false, cfMode: false },
      temperatureStatusText: 'warning',
      powerStatusFlags: { limitedByTemperature: true, limitedByCable: false },
      powerStateChangeFields: { newPowerState: 'S0', newPowerStateIndicator: 'on' },
    });
    roundTrip('Status', '2d060004042009');
  });

  it('Source_Capabilities_Extended (§6.5.1): Voltage Regulation, Compliance, Peak Current and Touch Temp sub-fields', () => {
    // VID 0x1234, PID 0x5678, XID 0, FW 1, HW 2, Voltage Regulation 0x05 (500 mA/µs, 90 %), Holdup 3 ms,
    // Compliance 0x01 (LPS), Touch Current 0x02 (ground pin), Peak Current1 0x514f (150 %, 200 ms, 50 %),
    // Peak Current2/3 0, Touch Temp 1 (IEC 62368-1 TS1), Source Inputs 0x03, Batteries 0x00, SPR PDP 65 W, EPR PDP 0.
    const block = '34127856000000000102050301024f510000000001030041' + '00';
    const data = decodeDataBlock('Source_Capabilities_Extended', bytes(block));
    expect(data).toMatchObject({
      vid: 0x1234,
      pid: 0x5678,
      holdupTimeMs: 3,
      sprSourcePdpW: 65,
      voltageRegulationFields: { loadStepMaPerUs: 500, loadStepMagnitudePercent: 90 },
      complianceFlags: { lps: true, ps1: false, ps2: false },
      touchCurrentFlags: { lowTouchCurrentEps: false, groundPinSupported: true },
      peakCurrent1Fields: { overloadPercent: 150, overloadPeriodMs: 200, dutyCyclePercent: 50, vbusVoltageDroop: false },
      touchTempText: 'IEC 62368-1 TS1',
      sourceInputsFlags: { externalSupply: true, externalSupplyUnconstrained: true, internalBattery: false },
    });
    roundTrip('Source_Capabilities_Extended', block);
  });

  it('Battery_Capabilities (§6.5.5): capacities in 0.1 Wh, 0xFFFF unknown', () => {
    const data = decodeDataBlock('Battery_Capabilities', bytes('34127856f401ffff00'));
    expect(data).toMatchObject({ vid: 0x1234, pid: 0x5678, batteryDesignCapacity: 500, batteryDesignCapacityMwh: 50_000, batteryLastFullChargeCapacityMwh: null, invalidBatteryReference: false });
    roundTrip('Battery_Capabilities', '34127856f401ffff00');
  });

  it('Manufacturer_Info (§6.5.7): VID, PID and a NUL-terminated string', () => {
    const block = '34127856' + hex(new TextEncoder().encode('Kestrel Devices')) + '00';
    expect(decodeDataBlock('Manufacturer_Info', bytes(block))).toEqual({ vid: 0x1234, pid: 0x5678, manufacturerString: 'Kestrel Devices', trailing: '00' });
    roundTrip('Manufacturer_Info', block);
  });

  it('Country_Codes (§6.5.8) and Country_Info (§6.5.9)', () => {
    expect(decodeDataBlock('Country_Codes', bytes('02005553' + '4445'))).toEqual({ length: 2, reserved: 0, countryCodes: ['US', 'DE'] });
    roundTrip('Country_Codes', '020055534445');
    expect(decodeDataBlock('Country_Info', bytes('4a500000aabb'))).toEqual({ countryCode: 'JP', reserved: 0, countrySpecificData: 'aabb' });
    roundTrip('Country_Info', '4a500000aabb');
  });

  it('Sink_Capabilities_Extended (§6.5.13): the PDP fields in W', () => {
    const block = '341278560000000001020100000000000000' + '0f1e2d' + '8c8c8c';
    expect(decodeDataBlock('Sink_Capabilities_Extended', bytes(block))).toMatchObject({
      vid: 0x1234,
      skedbVersion: 1,
      sinkMinimumPdpW: 15,
      sinkOperationalPdpW: 30,
      sinkMaximumPdpW: 45,
      eprSinkMaximumPdpW: 140,
    });
    roundTrip('Sink_Capabilities_Extended', block);
  });

  it('any block of these types writes back to the same bytes (short blocks, extra bytes kept as trailing)', () => {
    const types = ['Status', 'Source_Capabilities_Extended', 'Battery_Capabilities', 'Get_Manufacturer_Info', 'Sink_Capabilities_Extended', 'Manufacturer_Info', 'Country_Codes', 'Country_Info'];
    fc.assert(
      fc.property(fc.constantFrom(...types), fc.uint8Array({ minLength: 4, maxLength: 26 }), (type, block) => {
        const data = decodeDataBlock(type, block);
        expect(data).toBeDefined();
        expect(hex(encodeDataBlock(type, data!))).toBe(hex(block));
      }),
      { numRuns: 2000 },
    );
  });
});
