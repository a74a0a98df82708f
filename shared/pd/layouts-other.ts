/**
 * Layouts of the data objects besides PDOs and RDOs, read and written by the generic codec of
 * layout.ts. USB PD R3.2 V1.1 §6.4 (table numbers and names as in R3.1 V1.8; from memory where
 * a note says so).
 */
import { flagBit as flagAt, reservedBits as R } from './field-layouts.ts';
import type { WordLayout } from './layout.ts';
import { VDO_LAYOUTS } from './layouts-vdo.ts';

/** §6.4.3 Table 6.27 "BIST Data Object": B31..28 BIST Mode, B27..0 Reserved. */
export const BIST_LAYOUT: WordLayout = {
  kind: 'bist',
  title: 'BIST Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.3, BIST Data Object table (R3.1 Table 6.27)',
  bits: 32,
  fields: [
    { name: 'mode', hi: 31, lo: 28, type: 'enum', label: 'BIST Mode', values: { 5: 'BIST Carrier Mode', 8: 'BIST Test Data', 9: 'BIST Shared Test Mode Entry', 10: 'BIST Shared Test Mode Exit' } },
    R(27, 0),
  ],
};

/** §6.4.6 "Alert Data Object": Type of Alert bits B31..24, battery masks, Extended Alert Event Type. */
export const ALERT_LAYOUT: WordLayout = {
  kind: 'alert',
  title: 'Alert Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.6, Alert Data Object table (R3.1 Table 6.41)',
  bits: 32,
  fields: [
    flagAt(31, 'extendedAlertEvent', 'Extended Alert Event'),
    flagAt(30, 'ovpEvent', 'OVP Event'),
    flagAt(29, 'sourceInputChange', 'Source Input Change Event'),
    flagAt(28, 'operatingConditionChange', 'Operating Condition Change'),
    flagAt(27, 'otpEvent', 'OTP Event'),
    flagAt(26, 'ocpEvent', 'OCP Event'),
    flagAt(25, 'batteryStatusChange', 'Battery Status Change Event'),
    R(24, 24),
    { name: 'fixedBatteries', hi: 23, lo: 20, type: 'uint', label: 'Fixed Batteries (bit per battery)' },
    { name: 'hotSwappableBatteries', hi: 19, lo: 16, type: 'uint', label: 'Hot Swappable Batteries (bit per battery)' },
    R(15, 4),
    {
      name: 'extendedAlertEventType',
      hi: 3,
      lo: 0,
      type: 'enum',
      label: 'Extended Alert Event Type',
      values: { 1: 'Power state change', 2: 'Power button press', 3: 'Power button release', 4: 'Controller initiated wake' },
    },
  ],
};

/** §6.4.5 "Battery Status Data Object" (from memory): capacity in 0.1 Wh, Battery Info. */
export const BATTERY_STATUS_LAYOUT: WordLayout = {
  kind: 'battery-status',
  title: 'Battery Status Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.5, Battery Status Data Object table (from memory)',
  bits: 32,
  fields: [
    { name: 'presentCapacityMwh', hi: 31, lo: 16, type: 'uint', scale: 100, unit: 'mWh', label: 'Battery Present Capacity (0.1 Wh; 0xFFFF unknown)' },
    R(15, 12),
    { name: 'chargingStatus', hi: 11, lo: 10, type: 'enum', label: 'Battery Charging Status', values: { 0: 'Charging', 1: 'Discharging', 2: 'Idle' } },
    flagAt(9, 'batteryPresent', 'Battery is present'),
    flagAt(8, 'invalidBatteryReference', 'Invalid Battery reference'),
    R(7, 0),
  ],
};

/** §6.4.7 "Country Code Data Object": two ASCII characters (ISO 3166), B15..0 Reserved. */
export const COUNTRY_CODE_LAYOUT: WordLayout = {
  kind: 'country-code',
  title: 'Country Code Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.7, Country Code Data Object table (from memory)',
  bits: 32,
  fields: [{ name: 'countryCode', hi: 31, lo: 16, type: 'ascii', label: 'Country Code (ISO 3166 alpha-2)' }, R(15, 0)],
};

/** §6.4.8 "Enter_USB Data Object" (from memory). */
export const ENTER_USB_LAYOUT: WordLayout = {
  kind: 'enter-usb',
  title: 'Enter_USB Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.8, Enter_USB Data Object table (from memory)',
  bits: 32,
  fields: [
    R(31, 31),
    { name: 'usbMode', hi: 30, lo: 28, type: 'enum', label: 'USB Mode', values: { 0: 'USB 2.0', 1: 'USB 3.2', 2: 'USB4' } },
    R(27, 27),
    flagAt(26, 'usb4Drd', 'USB4 DRD'),
    flagAt(25, 'usb3Drd', 'USB3 DRD'),
    R(24, 24),
    { name: 'cableSpeed', hi: 23, lo: 21, type: 'enum', label: 'Cable Speed', values: { 0: 'USB 2.0 only', 1: 'USB 3.2 Gen1', 2: 'USB 3.2 Gen2 / USB4 Gen2', 3: 'USB4 Gen3', 4: 'USB4 Gen4' } },
    { name: 'cableType', hi: 20, lo: 19, type: 'enum', label: 'Cable Type', values: { 0: 'Passive', 1: 'Active Re-timer', 2: 'Active Re-driver', 3: 'Optically Isolated' } },
    { name: 'cableCurrent', hi: 18, lo: 17, type: 'enum', label: 'Cable Current', values: { 0: 'VBUS not supported', 2: '3 A', 3: '5 A' } },
    flagAt(16, 'pcieSupport', 'PCIe Support'),
    flagAt(15, 'dpSupport', 'DP Support'),
    flagAt(14, 'tbtSupport', 'TBT Support'),
    flagAt(13, 'hostPresent', 'Host Present'),
    R(12, 0),
  ],
};

/** §6.4.9 "EPR Mode Data Object": B31..24 Action, B23..16 Data, B15..0 Reserved. */
export const EPR_MODE_LAYOUT: WordLayout = {
  kind: 'epr-mode',
  title: 'EPR Mode Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.9, EPR Mode Data Object table (R3.1 Table 6.50)',
  bits: 32,
  fields: [
    { name: 'action', hi: 31, lo: 24, type: 'enum', label: 'Action', values: { 1: 'Enter', 2: 'Enter Acknowledged', 3: 'Enter Succeeded', 4: 'Enter Failed', 5: 'Exit' } },
    { name: 'data', hi: 23, lo: 16, type: 'uint', label: 'Data (Enter: EPR Sink Operational PDP in W; Enter Failed: reason code)' },
    R(15, 0),
  ],
};

/** §6.4.11 "Source Information Data Object": B31 Port Type, B23..16/15..8/7..0 PDPs in W. */
export const SOURCE_INFO_LAYOUT: WordLayout = {
  kind: 'source-info',
  title: 'Source Information Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.11, Source Information Data Object table (from memory)',
  bits: 32,
  fields: [
    { name: 'portType', hi: 31, lo: 31, type: 'enum', label: 'Port Type', values: { 0: 'Managed Capability', 1: 'Guaranteed Capability' } },
    R(30, 24),
    { name: 'portMaximumPdpW', hi: 23, lo: 16, type: 'uint', unit: 'W', label: 'Port Maximum PDP' },
    { name: 'portPresentPdpW', hi: 15, lo: 8, type: 'uint', unit: 'W', label: 'Port Present PDP' },
    { name: 'portReportedPdpW', hi: 7, lo: 0, type: 'uint', unit: 'W', label: 'Port Reported PDP' },
  ],
};

/** §6.4.12 "Revision Message Data Object": revision and version, major and minor, 4 bits each. */
export const REVISION_LAYOUT: WordLayout = {
  kind: 'revision',
  title: 'Revision Message Data Object',
  ref: 'USB PD R3.2 V1.1 §6.4.12, Revision Message Data Object table (from memory)',
  bits: 32,
  fields: [
    { name: 'revisionMajor', hi: 31, lo: 28, type: 'uint', label: 'Revision.major' },
    { name: 'revisionMinor', hi: 27, lo: 24, type: 'uint', label: 'Revision.minor' },
    { name: 'versionMajor', hi: 23, lo: 20, type: 'uint', label: 'Version.major' },
    { name: 'versionMinor', hi: 19, lo: 16, type: 'uint', label: 'Version.minor' },
    R(15, 0),
  ],
};

const VDM_COMMANDS: Record<number, string> = { 1: 'Discover Identity', 2: 'Discover SVIDs', 3: 'Discover Modes', 4: 'Enter Mode', 5: 'Exit Mode', 6: 'Attention' };

/** §6.4.4.2 "Structured VDM Header" (R3.1 Table 6.29). */
export const VDM_STRUCTURED_LAYOUT: WordLayout = {
  kind: 'vdm-header',
  title: 'Structured VDM Header',
  ref: 'USB PD R3.2 V1.1 §6.4.4.2, Structured VDM Header table (R3.1 Table 6.29)',
  bits: 32,
  fields: [
    { name: 'svid', hi: 31, lo: 16, type: 'uint', label: 'Standard or Vendor ID (SVID)' },
    { name: 'structured', hi: 15, lo: 15, type: 'flag', label: 'VDM Type (1 = Structured)' },
    { name: 'versionMajor', hi: 14, lo: 13, type: 'uint', label: 'Structured VDM Version (Major): 01b = 2.x' },
    { name: 'versionMinor', hi: 12, lo: 11, type: 'uint', label: 'Structured VDM Version (Minor): 00b = 2.0, 01b = 2.1' },
    { name: 'objectPosition', hi: 10, lo: 8, type: 'uint', label: 'Object Position' },
    { name: 'commandType', hi: 7, lo: 6, type: 'enum', label: 'Command Type', values: { 0: 'REQ', 1: 'ACK', 2: 'NAK', 3: 'BUSY' } },
    R(5, 5),
    { name: 'command', hi: 4, lo: 0, type: 'enum', label: 'Command (16–31: SVID specific)', values: VDM_COMMANDS },
  ],
};

/** §6.4.4.1 "Unstructured VDM Header" (R3.1 Table 6.28). */
export const VDM_UNSTRUCTURED_LAYOUT: WordLayout = {
  kind: 'vdm-header',
  title: 'Unstructured VDM Header',
  ref: 'USB PD R3.2 V1.1 §6.4.4.1, Unstructured VDM Header table (R3.1 Table 6.28)',
  bits: 32,
  fields: [
    { name: 'svid', hi: 31, lo: 16, type: 'uint', label: 'Vendor ID (VID)' },
    { name: 'structured', hi: 15, lo: 15, type: 'flag', label: 'VDM Type (0 = Unstructured)' },
    { name: 'vendorUse', hi: 14, lo: 0, type: 'uint', label: 'Available for Vendor Use' },
  ],
};

/** The layout of an object kind (for a VDM header, by its VDM Type bit). */
export function otherLayout(kind: string, raw: number): WordLayout | undefined {
  switch (kind) {
    case 'bist':
      return BIST_LAYOUT;
    case 'alert':
      return ALERT_LAYOUT;
    case 'battery-status':
      return BATTERY_STATUS_LAYOUT;
    case 'country-code':
      return COUNTRY_CODE_LAYOUT;
    case 'enter-usb':
      return ENTER_USB_LAYOUT;
    case 'epr-mode':
      return EPR_MODE_LAYOUT;
    case 'source-info':
      return SOURCE_INFO_LAYOUT;
    case 'revision':
      return REVISION_LAYOUT;
    case 'vdm-header':
      return raw & 0x8000 ? VDM_STRUCTURED_LAYOUT : VDM_UNSTRUCTURED_LAYOUT;
    default:
      return VDO_LAYOUTS[kind];
  }
}
