import { describe, expect, it } from 'vitest';
import { countersFor, timersFor } from './timers.ts';

describe('timer table', () => {
  // USB PD R3.2 V1.1 §6.6 Time Values: tSenderResponse 27–33 ms; USB PD R2.0 V1.3 §6.6: 24–30 ms.
  it('picks tSenderResponse by revision', () => {
    expect(timersFor('3.0').tSenderResponse).toMatchObject({ minUs: 27_000, maxUs: 33_000 });
    expect(timersFor('2.0').tSenderResponse).toMatchObject({ minUs: 24_000, maxUs: 30_000 });
  });
  // USB PD R3.2 V1.1 §6.7 Counter Values: nRetryCount 2 (R3.x), 3 (R2.0).
  it('picks nRetryCount by revision', () => {
    expect(countersFor('3.0').nRetryCount).toBe(2);
    expect(countersFor('2.0').nRetryCount).toBe(3);
  });
});
