/**
 * Message Type codes, spelled as the specification spells them.
 *
 * USB PD R3.2 V1.1 §6.3 Table 6.5 "Control Message Types", §6.4 Table 6.6 "Data Message Types",
 * §6.5 Table 6.53 "Extended Message Types" (table numbers as in R3.1 V1.8; from memory for R3.2).
 * A header with Number of Data Objects 0 and Extended 0 is a Control Message, with objects a
 * Data Message (§6.2.1.1.2); R2.0 used a 4-bit type field and fewer codes.
 */
import type { MessageCategory } from './types.ts';

type Table = readonly (string | undefined)[];

/** Index = 5-bit Message Type code; `undefined` = Reserved. */
export const CONTROL_TYPES: Table = [
  undefined,
  'GoodCRC',
  'GotoMin',
  'Accept',
  'Reject',
  'Ping',
  'PS_RDY',
  'Get_Source_Cap',
  'Get_Sink_Cap',
  'DR_Swap',
  'PR_Swap',
  'VCONN_Swap',
  'Wait',
  'Soft_Reset',
  'Data_Reset',
  'Data_Reset_Complete',
  'Not_Supported',
  'Get_Source_Cap_Extended',
  'Get_Status',
  'FR_Swap',
  'Get_PPS_Status',
  'Get_Country_Codes',
  'Get_Sink_Cap_Extended',
  'Get_Source_Info',
  'Get_Revision',
];

export const DATA_TYPES: Table = [
  undefined,
  'Source_Capabilities',
  'Request',
  'BIST',
  'Sink_Capabilities',
  'Battery_Status',
  'Alert',
  'Get_Country_Info',
  'Enter_USB',
  'EPR_Request',
  'EPR_Mode',
  'Source_Info',
  'Revision',
  undefined,
  undefined,
  'Vendor_Defined',
];

export const EXTENDED_TYPES: Table = [
  undefined,
  'Source_Capabilities_Extended',
  'Status',
  'Get_Battery_Cap',
  'Get_Battery_Status',
  'Battery_Capabilities',
  'Get_Manufacturer_Info',
  'Manufacturer_Info',
  'Security_Request',
  'Security_Response',
  'Firmware_Update_Request',
  'Firmware_Update_Response',
  'PPS_Status',
  'Country_Info',
  'Country_Codes',
  'Sink_Capabilities_Extended',
  'Extended_Control',
  'EPR_Source_Capabilities',
  'EPR_Sink_Capabilities',
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  undefined,
  'Vendor_Defined_Extended',
];

export const RESERVED_TYPE = 'Reserved';

const TABLES: Record<MessageCategory, Table> = { control: CONTROL_TYPES, data: DATA_TYPES, extended: EXTENDED_TYPES };

const BY_NAME = new Map<string, { category: MessageCategory; code: number }>();
for (const category of ['control', 'data', 'extended'] as const) {
  TABLES[category].forEach((name, code) => {
    if (name !== undefined) BY_NAME.set(name, { category, code });
  });
}

/** The name of a 5-bit code in a category, or `Reserved`. */
export function messageTypeName(category: MessageCategory, code: number): string {
  return TABLES[category][code & 0x1f] ?? RESERVED_TYPE;
}

/** Category and 5-bit code of a message type name; `undefined` for an unknown name (and for `Reserved`). */
export function messageTypeCode(name: string): { category: MessageCategory; code: number } | undefined {
  return BY_NAME.get(name);
}

/** Every defined name, by category (for pickers and generators). */
export function messageTypeNames(category: MessageCategory): string[] {
  return TABLES[category].filter((n): n is string => n !== undefined);
}
