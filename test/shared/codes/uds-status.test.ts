import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { decodeUdsStatus, encodeUdsStatus, udsStatusBits } from '../../../shared/codes';

describe('decodeUdsStatus', () => {
  it('0x08 is confirmed only', () => {
    // UDS status bits, references.md §1 [S, secondary]; 0x08 = confirmed only [C]
    const s = decodeUdsStatus(0x08);
    expect(s.active).toEqual(['confirmedDTC']);
    expect(s.bits.confirmedDTC).toBe(true);
    expect(s.bits.pendingDTC).toBe(false);
    expect(s.bits.testFailed).toBe(false);
  });

  it('names bits 0-7 in the published order', () => {
    // references.md §1
    expect(udsStatusBits).toEqual([
      'testFailed',
      'testFailedThisOperationCycle',
      'pendingDTC',
      'confirmedDTC',
      'testNotCompletedSinceLastClear',
      'testFailedSinceLastClear',
      'testNotCompletedThisOperationCycle',
      'warningIndicatorRequested',
    ]);
  });

  it.each([
    [0x01, ['testFailed']],
    [0x04, ['pendingDTC']],
    [0x80, ['warningIndicatorRequested']],
    [0x2f, ['testFailed', 'testFailedThisOperationCycle', 'pendingDTC', 'confirmedDTC', 'testFailedSinceLastClear']],
    [0x00, []],
  ] as const)('0x%s -> %j', (byte, active) => {
    expect(decodeUdsStatus(byte).active).toEqual(active);
  });

  it('0xFF sets all eight bits', () => {
    expect(Object.values(decodeUdsStatus(0xff).bits).every(Boolean)).toBe(true);
  });

  it('encode inverts decode for every byte', () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 255 }), (b) => {
        expect(encodeUdsStatus(decodeUdsStatus(b).active)).toBe(b);
      }),
    );
  });

  it.each([256, -1, 0.5])('rejects %s', (bad) => {
    expect(() => decodeUdsStatus(bad)).toThrow(RangeError);
  });
});
