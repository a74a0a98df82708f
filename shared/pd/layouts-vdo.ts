/**
 * Layouts of the VDOs of a Discover Identity ACK and a Discover SVIDs ACK (USB PD R3.1 V1.8 /
 * R3.2 V1.1 §6.4.4.3.1 and §6.4.4.3.2; VDO tables R3.1 Table 6.33 ID Header … Table 6.44 VPD).
 * The table contents were written from memory and their bit positions and codes confirmed against
 * an open-source Type-C library's PD 3.1 field tables (not the specification text itself); fields
 * marked "from memory" were not confirmed there.
 */
import { enumBits as enumAt, flagBit as flagAt, reservedBits as R, uintBits, word32 } from './field-layouts.ts';
import type { WordLayout } from './layout.ts';

const REF = 'USB PD R3.2 V1.1 §6.4.4.3.1';

/** USB Highest Speed (UFP VDO, cable VDOs). */
export const USB_HIGHEST_SPEED: Record<number, string> = { 0: 'USB 2.0 only', 1: 'USB 3.2 Gen1', 2: 'USB 3.2 / USB4 Gen2', 3: 'USB4 Gen3', 4: 'USB4 Gen4' };
/** Maximum VBUS Voltage (cable and VPD VDOs): 30 V and 40 V are deprecated in R3.1. */
export const MAX_VBUS_VOLTAGE: Record<number, string> = { 0: '20 V', 1: '30 V', 2: '40 V', 3: '50 V' };
export const MAX_VBUS_VOLTAGE_MV: Record<number, number> = { 0: 20_000, 1: 30_000, 2: 40_000, 3: 50_000 };
/** VBUS Current Handling Capability (cable VDOs); 00b is "USB Type-C Default Current" on an active cable, reserved on a passive one. */
export const VBUS_CURRENT: Record<number, string> = { 0: 'USB Type-C Default Current', 1: '3 A', 2: '5 A' };
export const VBUS_CURRENT_MA: Record<number, number> = { 1: 3_000, 2: 5_000 };
const PLUG: Record<number, string> = { 2: 'USB Type-C', 3: 'Captive' };
const CONNECTOR: Record<number, string> = { 2: 'USB Type-C Receptacle', 3: 'USB Type-C Plug' };

/** Product Type (UFP) on SOP (R3.1 Table 6.33; 101b Alternate Mode Adapter is R3.0's). */
export const PRODUCT_TYPE_UFP: Record<number, string> = { 0: 'Not a UFP', 1: 'PDUSB Hub', 2: 'PDUSB Peripheral', 3: 'PSD', 5: 'Alternate Mode Adapter' };
/** Product Type (DFP) on SOP (100b Alternate Mode Controller is R3.0's). */
export const PRODUCT_TYPE_DFP: Record<number, string> = { 0: 'Not a DFP', 1: 'PDUSB Hub', 2: 'PDUSB Host', 3: 'Power Brick', 4: 'Alternate Mode Controller' };
/** Product Type (Cable Plug/VPD) on SOP'. */
export const PRODUCT_TYPE_CABLE: Record<number, string> = { 0: 'Not a Cable Plug/VPD', 3: 'Passive Cable', 4: 'Active Cable', 6: 'VCONN-Powered USB Device' };

const idHeaderTop = [
  flagAt(31, 'usbCommunicationsCapableAsHost', 'USB Communications Capable as USB Host'),
  flagAt(30, 'usbCommunicationsCapableAsDevice', 'USB Communications Capable as USB Device'),
];
const idHeaderBottom = [enumAt(22, 21, 'connectorType', 'Connector Type', CONNECTOR), R(20, 16), uintBits(15, 0, 'usbVendorId', 'USB Vendor ID')];

/** ID Header VDO of a port partner (on SOP). */
export const ID_HEADER_LAYOUT: WordLayout = word32('id-header', 'ID Header VDO', `${REF}.1, ID Header VDO table (R3.1 Table 6.33; number from memory)`, [
  ...idHeaderTop,
  enumAt(29, 27, 'productTypeUfp', 'Product Type (UFP)', PRODUCT_TYPE_UFP),
  flagAt(26, 'modalOperationSupported', 'Modal Operation Supported'),
  enumAt(25, 23, 'productTypeDfp', 'Product Type (DFP)', PRODUCT_TYPE_DFP),
  ...idHeaderBottom,
]);

/** ID Header VDO of a cable plug or VPD (on SOP'); Product Type (DFP) is zero there. */
export const CABLE_ID_HEADER_LAYOUT: WordLayout = word32('cable-id-header', 'ID Header VDO (cable plug)', `${REF}.1, ID Header VDO table (R3.1 Table 6.33; number from memory)`, [
  ...idHeaderTop,
  enumAt(29, 27, 'productTypeCablePlug', 'Product Type (Cable Plug/VPD)', PRODUCT_TYPE_CABLE),
  flagAt(26, 'modalOperationSupported', 'Modal Operation Supported'),
  R(25, 23),
  ...idHeaderBottom,
]);

export const CERT_STAT_LAYOUT: WordLayout = word32('cert-stat', 'Cert Stat VDO', `${REF}.2, Cert Stat VDO table (R3.1 Table 6.37; number from memory)`, [
  uintBits(31, 0, 'xid', 'XID (assigned by USB-IF)'),
]);

export const PRODUCT_LAYOUT: WordLayout = word32('product', 'Product VDO', `${REF}.3, Product VDO table (R3.1 Table 6.38; number from memory)`, [
  uintBits(31, 16, 'usbProductId', 'USB Product ID'),
  uintBits(15, 0, 'bcdDevice', 'bcdDevice'),
]);

export const UFP_LAYOUT: WordLayout = word32('ufp', 'UFP VDO', `${REF}.4, UFP VDO table (R3.1 Table 6.39; number from memory)`, [
  uintBits(31, 29, 'ufpVdoVersion', 'UFP VDO Version (011b = 1.3)'),
  R(28, 28),
  flagAt(27, 'usb4DeviceCapable', 'Device Capability: USB4 Device'),
  flagAt(26, 'usb32DeviceCapable', 'Device Capability: USB 3.2 Device'),
  flagAt(25, 'usb2BillboardOnly', 'Device Capability: USB 2.0 Device (Billboard only)'),
  flagAt(24, 'usb2DeviceCapable', 'Device Capability: USB 2.0 Device'),
  uintBits(23, 22, 'connectorTypeLegacy', 'Connector Type (Legacy; 00b in R3.1)'),
  R(21, 11),
  enumAt(10, 8, 'vconnPower', 'VCONN Power', { 0: '1 W', 1: '1.5 W', 2: '2 W', 3: '3 W', 4: '4 W', 5: '5 W', 6: '6 W' }),
  flagAt(7, 'vconnRequired', 'VCONN Required'),
  flagAt(6, 'vbusRequired', 'VBUS Required (0b = yes)', true),
  flagAt(5, 'nonReconfigurableAlternateModes', "Alternate Modes: modes that do not reconfigure the connector's signals"),
  flagAt(4, 'reconfigurableAlternateModes', "Alternate Modes: modes that reconfigure the connector's signals"),
  flagAt(3, 'tbt3AlternateMode', 'Alternate Modes: TBT3'),
  enumAt(2, 0, 'usbHighestSpeed', 'USB Highest Speed', USB_HIGHEST_SPEED),
]);

export const DFP_LAYOUT: WordLayout = word32('dfp', 'DFP VDO', `${REF}.5, DFP VDO table (R3.1 Table 6.40; number from memory)`, [
  uintBits(31, 29, 'dfpVdoVersion', 'DFP VDO Version'),
  R(28, 27),
  flagAt(26, 'usb4HostCapable', 'Host Capability: USB4 Host'),
  flagAt(25, 'usb32HostCapable', 'Host Capability: USB 3.2 Host'),
  flagAt(24, 'usb2HostCapable', 'Host Capability: USB 2.0 Host'),
  uintBits(23, 22, 'connectorTypeLegacy', 'Connector Type (Legacy; 00b in R3.1)'),
  R(21, 5),
  uintBits(4, 0, 'portNumber', 'Port Number'),
]);

const cableTop = [
  uintBits(31, 28, 'hwVersion', 'HW Version'),
  uintBits(27, 24, 'firmwareVersion', 'Firmware Version'),
  uintBits(23, 21, 'vdoVersion', 'VDO Version'),
  R(20, 20),
  enumAt(19, 18, 'plugToPlugOrCaptive', 'USB Type-C plug to USB Type-C / Captive', PLUG),
  flagAt(17, 'eprModeCapable', 'EPR Mode Capable'),
];
const PASSIVE_LATENCY: Record<number, string> = {
  1: '<10 ns (~1 m)',
  2: '10–20 ns (~2 m)',
  3: '20–30 ns (~3 m)',
  4: '30–40 ns (~4 m)',
  5: '40–50 ns (~5 m)',
  6: '50–60 ns (~6 m)',
  7: '60–70 ns (~7 m)',
  8: '>70 ns (>~7 m)',
};
const ACTIVE_LATENCY: Record<number, string> = { ...PASSIVE_LATENCY, 8: '1000 ns (~100 m)', 9: '2000 ns (~200 m)', 10: '3000 ns (~300 m)' };

export const PASSIVE_CABLE_LAYOUT: WordLayout = word32('passive-cable', 'Passive Cable VDO', `${REF}.6, Passive Cable VDO table (R3.1 Table 6.41; number from memory)`, [
  ...cableTop,
  enumAt(16, 13, 'cableLatency', 'Cable Latency', PASSIVE_LATENCY),
  enumAt(12, 11, 'cableTerminationType', 'Cable Termination Type', { 0: 'VCONN not required', 1: 'VCONN required' }),
  enumAt(10, 9, 'maximumVbusVoltage', 'Maximum VBUS Voltage', MAX_VBUS_VOLTAGE),
  R(8, 7),
  enumAt(6, 5, 'vbusCurrentHandlingCapability', 'VBUS Current Handling Capability', { 1: '3 A', 2: '5 A' }),
  R(4, 3),
  enumAt(2, 0, 'usbHighestSpeed', 'USB Highest Speed', USB_HIGHEST_SPEED),
]);

export const ACTIVE_CABLE_1_LAYOUT: WordLayout = word32('active-cable-1', 'Active Cable VDO1', `${REF}.7, Active Cable VDO1 table (R3.1 Table 6.42; number from memory)`, [
  ...cableTop,
  enumAt(16, 13, 'cableLatency', 'Cable Latency', ACTIVE_LATENCY),
  enumAt(12, 11, 'cableTerminationType', 'Cable Termination Type', { 2: 'One end active, one end passive, VCONN required', 3: 'Both ends active, VCONN required' }),
  enumAt(10, 9, 'maximumVbusVoltage', 'Maximum VBUS Voltage', MAX_VBUS_VOLTAGE),
  flagAt(8, 'sbuSupported', 'SBU Supported (0b = supported)', true),
  enumAt(7, 7, 'sbuType', 'SBU Type', { 0: 'Passive', 1: 'Active' }),
  enumAt(6, 5, 'vbusCurrentHandlingCapability', 'VBUS Current Handling Capability', VBUS_CURRENT),
  flagAt(4, 'vbusThroughCable', 'VBUS Through Cable'),
  flagAt(3, 'sopDoublePrimeControllerPresent', "SOP'' Controller Present"),
  enumAt(2, 0, 'usbHighestSpeed', 'USB Highest Speed', USB_HIGHEST_SPEED),
]);

export const ACTIVE_CABLE_2_LAYOUT: WordLayout = word32('active-cable-2', 'Active Cable VDO2', `${REF}.8, Active Cable VDO2 table (R3.1 Table 6.43; number from memory)`, [
  uintBits(31, 24, 'maxOperatingTemperatureC', 'Maximum Operating Temperature', 1, '°C'),
  uintBits(23, 16, 'shutdownTemperatureC', 'Shutdown Temperature', 1, '°C'),
  R(15, 15),
  enumAt(14, 12, 'u3CldPower', 'U3/CLd Power', { 0: '>10 mW', 1: '5–10 mW', 2: '1–5 mW', 3: '0.5–1 mW', 4: '0.2–0.5 mW', 5: '50–200 µW', 6: '<50 µW' }),
  enumAt(11, 11, 'u3ToU0TransitionMode', 'U3 to U0 transition mode', { 0: 'U3 to U0 direct', 1: 'U3 to U0 through U3S' }),
  enumAt(10, 10, 'physicalConnection', 'Physical connection', { 0: 'Copper', 1: 'Optical' }),
  enumAt(9, 9, 'activeElement', 'Active element', { 0: 'Active Re-driver', 1: 'Active Re-timer' }),
  flagAt(8, 'usb4Supported', 'USB4 Supported (0b = supported)', true),
  uintBits(7, 6, 'usb2HubHopsConsumed', 'USB 2.0 Hub Hops Consumed'),
  flagAt(5, 'usb2Supported', 'USB 2.0 Supported (0b = supported)', true),
  flagAt(4, 'usb32Supported', 'USB 3.2 Supported (0b = supported)', true),
  enumAt(3, 3, 'usbLanesSupported', 'USB Lanes Supported', { 0: 'One lane', 1: 'Two lanes' }),
  flagAt(2, 'opticallyIsolated', 'Optically Isolated Active Cable'),
  flagAt(1, 'usb4AsymmetricMode', 'USB4 Asymmetric Mode Supported (R3.2; from memory)'),
  enumAt(0, 0, 'usbGen', 'USB Gen', { 0: 'Gen 1', 1: 'Gen 2 or higher' }),
]);

export const VPD_LAYOUT: WordLayout = word32('vpd', 'VPD VDO', `${REF}.9, VPD VDO table (R3.1 Table 6.44; number from memory)`, [
  uintBits(31, 28, 'hwVersion', 'HW Version'),
  uintBits(27, 24, 'firmwareVersion', 'Firmware Version'),
  uintBits(23, 21, 'vdoVersion', 'VDO Version'),
  R(20, 17),
  enumAt(16, 15, 'maximumVbusVoltage', 'Maximum VBUS Voltage', MAX_VBUS_VOLTAGE),
  enumAt(14, 14, 'chargeThroughCurrentSupport', 'Charge Through Current Support', { 0: '3 A', 1: '5 A' }),
  R(13, 13),
  uintBits(12, 7, 'vbusImpedanceMohm', 'VBUS Impedance (2 mΩ units)', 2, 'mΩ'),
  uintBits(6, 1, 'groundImpedanceMohm', 'Ground Impedance (1 mΩ units)', 1, 'mΩ'),
  flagAt(0, 'chargeThroughSupport', 'Charge Through Support'),
]);

/** Discover SVIDs ACK: two SVIDs a VDO; a zero SVID ends the list (§6.4.4.3.2). */
export const SVIDS_LAYOUT: WordLayout = word32('svids', 'Discover SVIDs Responder VDO', 'USB PD R3.2 V1.1 §6.4.4.3.2, Discover SVIDs Responder VDO table (R3.1 Table 6.45)', [
  uintBits(31, 16, 'svidN', 'SVID n'),
  uintBits(15, 0, 'svidNPlus1', 'SVID n+1'),
]);

/** The 32-bit pad between the UFP and DFP VDOs of a dual-role port (all zero; from memory). */
export const PAD_LAYOUT: WordLayout = word32('pad', 'Pad (between UFP and DFP VDOs)', `${REF}, Discover Identity response of a DRD (from memory)`, [R(31, 0)]);

export const VDO_LAYOUTS: Readonly<Record<string, WordLayout>> = {
  'id-header': ID_HEADER_LAYOUT,
  'cable-id-header': CABLE_ID_HEADER_LAYOUT,
  'cert-stat': CERT_STAT_LAYOUT,
  product: PRODUCT_LAYOUT,
  ufp: UFP_LAYOUT,
  dfp: DFP_LAYOUT,
  'passive-cable': PASSIVE_CABLE_LAYOUT,
  'active-cable-1': ACTIVE_CABLE_1_LAYOUT,
  'active-cable-2': ACTIVE_CABLE_2_LAYOUT,
  vpd: VPD_LAYOUT,
  svids: SVIDS_LAYOUT,
  pad: PAD_LAYOUT,
};
