import { describe, expect, it } from 'vitest';
import { messageTypeOfHex, runMessages } from './messages.ts';

describe('runMessages', () => {
  it('reads the type from the header (USB PD R3.2 V1.1 §6.2.1.1, Tables 6.5/6.6)', () => {
    // 0x0041: Control, type 1 = GoodCRC; 0x1042: one object, Data type 2 = Request; 0x01a6 → type 6 PS_RDY.
    expect(messageTypeOfHex('4100')).toBe('GoodCRC');
    expect(messageTypeOfHex('42102c910100')).toBe('Request');
    expect(messageTypeOfHex('a601')).toBe('PS_RDY');
    expect(messageTypeOfHex('a1212c910100')).toBe('Source_Capabilities');
  });

  it("numbers each sender's messages of a type, skipping corrupted copies and events", () => {
    const messages = runMessages([
      { t: 0, event: 'attach' },
      { t: 10, msg: 'a1112c910100', from: 'source' },
      { t: 20, msg: 'a1112c910100', from: 'source', crcOk: false },
      { t: 30, msg: '4100', from: 'sink' },
      { t: 40, msg: 'a1112c910100', from: 'source' },
      { t: 50, msg: '4102', from: 'sink' },
    ]);
    expect(messages.map((m) => [m.index, m.from, m.messageType, m.nth])).toEqual([
      [0, 'source', 'Source_Capabilities', 1],
      [1, 'sink', 'GoodCRC', 1],
      [2, 'source', 'Source_Capabilities', 2],
      [3, 'sink', 'GoodCRC', 2],
    ]);
  });
});
