/**
 * A long JSON Lines trace for tests and benchmarks (invented data at the fictional maker Kestrel
 * Devices): a programmable (PPS) contract kept alive once a second — Request, Accept, PS_RDY and
 * their GoodCRCs — with a VBUS reading every 100 ms and a Hard Reset and new negotiation every ten
 * minutes, as in bench/analyze.bench.ts. Written in pieces; `targetBytes` sets the size.
 */
import { closeSync, openSync, writeSync } from 'node:fs';

/** Wire-order hex of a 16-bit header (USB PD R3.2 V1.1 Table 6.1), low byte first. */
const h16 = (v: number): string => (v & 0xff).toString(16).padStart(2, '0') + (v >> 8).toString(16).padStart(2, '0');
const CAPS = 'a1412c9101002cd102002cb104003c21dcc0';
/** PPS RDO for object 4, 8.4 V 2.5 A (0x40034832), little-endian. */
const PPS_RDO = '32480340';

export function writeSyntheticTrace(path: string, targetBytes: number, title = 'Kestrel K65 on bench 2, PPS soak'): number {
  const fd = openSync(path, 'w');
  let buffer: string[] = [];
  let bytes = 0;
  const emit = (line: string) => {
    buffer.push(line);
    bytes += line.length + 1;
    if (buffer.length >= 10_000) flush();
  };
  const flush = () => {
    if (buffer.length > 0) writeSync(fd, buffer.join('\n') + '\n');
    buffer = [];
  };
  emit(`{"trace": 1, "title": ${JSON.stringify(title)}, "capturedAt": "2026-11-30T09:12:00Z"}`);
  let t = 0;
  let sinkId = 0;
  let sourceId = 0;
  let cycle = 0;
  const msg = (at: number, hex: string, from: string) => emit(`{"t": ${at}, "msg": "${hex}", "from": "${from}"}`);
  const negotiateStart = () => {
    emit(`{"t": ${t}, "event": "attach", "cc": "CC1", "rp": "3.0A"}`);
    msg(t + 150_000, CAPS, 'source');
    msg(t + 151_100, h16(0x0081), 'sink');
    sinkId = 0;
    sourceId = 1;
    t += 155_000;
  };
  negotiateStart();
  while (bytes < targetBytes) {
    msg(t, h16(0x1082 | (sinkId << 9)) + PPS_RDO, 'sink');
    msg(t + 700, h16(0x01a1 | (sinkId << 9)), 'source');
    msg(t + 3_000, h16(0x01a3 | (sourceId << 9)), 'source');
    msg(t + 3_560, h16(0x0081 | (sourceId << 9)), 'sink');
    const next = (sourceId + 1) & 7;
    msg(t + 23_000, h16(0x01a6 | (next << 9)), 'source');
    msg(t + 23_560, h16(0x0081 | (next << 9)), 'sink');
    sinkId = (sinkId + 1) & 7;
    sourceId = (next + 1) & 7;
    for (let k = 0; k < 10; k++) emit(`{"t": ${t + 50_000 + k * 100_000}, "vbus": {"mv": ${8_380 + ((cycle * 7 + k * 13) % 50)}, "ma": ${2_100 + ((cycle + k) % 300)}}}`);
    t += 1_000_000;
    cycle++;
    if (cycle % 600 === 0) {
      emit(`{"t": ${t}, "event": "hard_reset", "from": "sink"}`);
      t += 1_000_000;
      negotiateStart();
    }
  }
  flush();
  closeSync(fd);
  return bytes;
}
