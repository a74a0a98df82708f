/**
 * Builders of Discover Identity and Discover SVIDs messages in the decoded form (for the
 * simulator's cable plug and port partner, and for vectors), and the reader of a cable's limits
 * from a decoded Discover Identity ACK. USB PD R3.2 V1.1 §6.4.4.3.1 (Discover Identity),
 * §6.4.4.3.2 (Discover SVIDs); VDO layouts in layouts-vdo.ts. `encodeMessage` turns the result
 * into bytes.
 */
import type { DataObjectInput, MessageInput } from './encode-message.ts';
import { PD_SID } from './vdm-objects.ts';
import type { Message, Sop, SpecRevision } from './types.ts';

export interface VdmMessageOptions {
  sop?: Sop;
  messageId?: number;
  specRevision?: SpecRevision;
  /** Structured VDM Version (Minor): 0 = 2.0, 1 = 2.1 (§6.4.4.2; default 0). */
  svdmVersionMinor?: number;
  /** SOP only: the sender's roles. */
  powerRole?: 'source' | 'sink';
  dataRole?: 'dfp' | 'ufp';
}

type CommandType = 'REQ' | 'ACK' | 'NAK' | 'BUSY';

function vdmHeader(command: string, commandType: CommandType, options: VdmMessageOptions): DataObjectInput {
  return { kind: 'vdm-header', svid: PD_SID, structured: true, versionMajor: 1, versionMinor: options.svdmVersionMinor ?? 0, objectPosition: 0, commandType, command };
}

function vdmMessage(objects: DataObjectInput[], options: VdmMessageOptions, request = false): MessageInput {
  const sop = options.sop ?? 'SOP';
  const base = { messageType: 'Vendor_Defined', messageId: options.messageId ?? 0, specRevision: options.specRevision ?? ('3.0' as const) };
  // A cable plug answers on SOP'/SOP'' with Cable Plug = 1; the port's requests to it carry 0.
  const header = sop === 'SOP' ? { ...base, powerRole: options.powerRole ?? 'source', dataRole: options.dataRole ?? 'dfp' } : { ...base, cablePlug: !request };
  return { sop, header, objects };
}

/** A Discover Identity request (the VDM header alone), by default to the cable plug on SOP'. */
export function discoverIdentityRequest(options: VdmMessageOptions = {}): MessageInput {
  return vdmMessage([vdmHeader('Discover Identity', 'REQ', options)], { sop: "SOP'", ...options }, true);
}

/** A Discover Identity ACK from the VDOs given (ID Header, Cert Stat, Product, Product Type VDOs). */
export function discoverIdentityAck(vdos: DataObjectInput[], options: VdmMessageOptions = {}): MessageInput {
  return vdmMessage([vdmHeader('Discover Identity', 'ACK', options), ...vdos], options);
}

/** A Discover SVIDs ACK: two SVIDs a VDO, ending with a zero SVID (an all-zero VDO when the count is even). */
export function discoverSvidsAck(svids: readonly number[], options: VdmMessageOptions = {}): MessageInput {
  const list = [...svids, 0];
  if (list.length % 2 === 1) list.push(0);
  const vdos: DataObjectInput[] = [];
  for (let i = 0; i < list.length; i += 2) vdos.push({ kind: 'svids', svidN: list[i]!, svidNPlus1: list[i + 1]! });
  return vdmMessage([vdmHeader('Discover SVIDs', 'ACK', options), ...vdos], options);
}

export interface CableIdentity {
  /** A passive cable (default) or an active one (VDO1 + VDO2). */
  active?: boolean;
  /** VBUS Current Handling Capability: 3 A or 5 A. */
  vbusCurrentMa: 3_000 | 5_000;
  /** Maximum VBUS Voltage (default 20 V; an EPR cable says 50 V). */
  maxVbusVoltageMv?: 20_000 | 30_000 | 40_000 | 50_000;
  eprModeCapable?: boolean;
  usbVendorId?: number;
  usbProductId?: number;
  bcdDevice?: number;
  xid?: number;
  /** USB Highest Speed as the layouts name it (default 'USB 2.0 only'). */
  usbHighestSpeed?: string;
  /** HW and Firmware Version of the cable VDO (default 1 each). */
  hwVersion?: number;
  firmwareVersion?: number;
}

const VOLTAGE_NAME: Record<number, string> = { 20_000: '20 V', 30_000: '30 V', 40_000: '40 V', 50_000: '50 V' };

/** The VDOs a cable plug sends in its Discover Identity ACK. */
export function cableIdentityVdos(cable: CableIdentity): DataObjectInput[] {
  const active = cable.active ?? false;
  const idHeader: DataObjectInput = {
    kind: 'cable-id-header',
    usbCommunicationsCapableAsHost: false,
    usbCommunicationsCapableAsDevice: false,
    productTypeCablePlug: active ? 'Active Cable' : 'Passive Cable',
    modalOperationSupported: false,
    connectorType: 'USB Type-C Plug',
    usbVendorId: cable.usbVendorId ?? 0,
  };
  const common = {
    hwVersion: cable.hwVersion ?? 1,
    firmwareVersion: cable.firmwareVersion ?? 1,
    plugToPlugOrCaptive: 'USB Type-C',
    eprModeCapable: cable.eprModeCapable ?? false,
    cableLatency: '<10 ns (~1 m)',
    maximumVbusVoltage: VOLTAGE_NAME[cable.maxVbusVoltageMv ?? 20_000]!,
    vbusCurrentHandlingCapability: cable.vbusCurrentMa === 5_000 ? '5 A' : '3 A',
    usbHighestSpeed: cable.usbHighestSpeed ?? 'USB 2.0 only',
  };
  const vdos: DataObjectInput[] = [idHeader, { kind: 'cert-stat', xid: cable.xid ?? 0 }, { kind: 'product', usbProductId: cable.usbProductId ?? 0, bcdDevice: cable.bcdDevice ?? 0x0100 }];
  if (!active) {
    vdos.push({ kind: 'passive-cable', ...common, vdoVersion: 0, cableTerminationType: 'VCONN not required' });
    return vdos;
  }
  vdos.push(
    {
      kind: 'active-cable-1',
      ...common,
      vdoVersion: 3,
      cableTerminationType: 'Both ends active, VCONN required',
      sbuSupported: false,
      sbuType: 'Passive',
      vbusThroughCable: true,
      sopDoublePrimeControllerPresent: false,
    },
    {
      kind: 'active-cable-2',
      maxOperatingTemperatureC: 70,
      shutdownTemperatureC: 85,
      u3CldPower: '>10 mW',
      u3ToU0TransitionMode: 'U3 to U0 direct',
      physicalConnection: 'Copper',
      activeElement: 'Active Re-timer',
      usb4Supported: false,
      usb2HubHopsConsumed: 0,
      usb2Supported: true,
      usb32Supported: true,
      usbLanesSupported: 'Two lanes',
      opticallyIsolated: false,
      usb4AsymmetricMode: false,
      usbGen: 'Gen 2 or higher',
    },
  );
  return vdos;
}

/** A cable plug's Discover Identity ACK on SOP' (Cable Plug = 1). */
export function cableIdentityAck(cable: CableIdentity, options: VdmMessageOptions = {}): MessageInput {
  return discoverIdentityAck(cableIdentityVdos(cable), { sop: "SOP'", ...options });
}

export interface CableLimits {
  kind: 'passive' | 'active' | 'vpd';
  /** null: the cable's VDO names no current (reserved code, or an active cable's USB Type-C default). */
  vbusCurrentMa: number | null;
  maxVbusVoltageMv: number;
  eprModeCapable: boolean;
}

/** A cable's limits from a decoded Discover Identity ACK (undefined when the message is not one from a cable). */
export function cableLimits(message: Pick<Message, 'objects'>): CableLimits | undefined {
  for (const o of message.objects) {
    const object = o as Record<string, unknown>;
    if (object.kind === 'passive-cable' || object.kind === 'active-cable-1') {
      return {
        kind: object.kind === 'passive-cable' ? 'passive' : 'active',
        vbusCurrentMa: object.vbusCurrentMa as number | null,
        maxVbusVoltageMv: object.maxVbusVoltageMv as number,
        eprModeCapable: object.eprModeCapable === true,
      };
    }
    if (object.kind === 'vpd') return { kind: 'vpd', vbusCurrentMa: object.chargeThroughCurrentMa as number, maxVbusVoltageMv: object.maxVbusVoltageMv as number, eprModeCapable: false };
  }
  return undefined;
}
