/**
 * Which layout describes a word of a decoded message: the header, the extended header, and each
 * data object by its kind and the message it is in (source or sink forms).
 */
import type { WordLayout } from './layout.ts';
import { otherLayout } from './layouts-other.ts';
import { EXTENDED_HEADER_LAYOUT, HEADER_CABLE_LAYOUT, HEADER_SOP_LAYOUT, RDO_LAYOUTS, SINK_PDO_LAYOUTS, SOURCE_PDO_LAYOUTS } from './layouts-power.ts';
import type { DataObject, Message } from './types.ts';

export { EXTENDED_HEADER_LAYOUT, HEADER_CABLE_LAYOUT, HEADER_SOP_LAYOUT, RDO_LAYOUTS, SINK_PDO_LAYOUTS, SOURCE_PDO_LAYOUTS };

export function headerLayout(message: Pick<Message, 'sop'>): WordLayout {
  return message.sop === 'SOP' ? HEADER_SOP_LAYOUT : HEADER_CABLE_LAYOUT;
}

/** The layout of a data object in a message of `messageType`; undefined for `raw` objects. */
export function objectLayout(object: DataObject, messageType: string): WordLayout | undefined {
  const raw = parseInt(object.raw, 16) >>> 0;
  if (object.kind in RDO_LAYOUTS) return RDO_LAYOUTS[object.kind];
  const sink = messageType === 'Sink_Capabilities' || messageType === 'EPR_Sink_Capabilities';
  const pdo = (sink ? SINK_PDO_LAYOUTS : SOURCE_PDO_LAYOUTS)[object.kind];
  if (pdo) return pdo;
  return otherLayout(object.kind, raw);
}
