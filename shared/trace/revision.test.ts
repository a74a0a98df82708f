import { describe, expect, it } from 'vitest';
import { createRevisionInOperation } from './revision.ts';
import type { SeenMessage } from './seen.ts';

const from = (side: 'source' | 'sink', revision: '2.0' | '3.0') => ({ from: side, d: { revision } }) as unknown as SeenMessage;

// USB PD R3.2 V1.1 §6.2.1.1.5: the ports operate at the lower revision; R2.0 tSenderResponse is 24–30 ms (§6.6).
describe('createRevisionInOperation', () => {
  it('takes the lower of the two ports', () => {
    const r = createRevisionInOperation();
    expect(r.timers().tSenderResponse.maxUs).toBe(33_000);
    r.note(from('source', '3.0'));
    r.note(from('sink', '2.0'));
    expect(r.timers().tSenderResponse.maxUs).toBe(30_000);
  });
});
