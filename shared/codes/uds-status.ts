// UDS (ISO 14229) DTC status byte, bits 0-7 (references.md §1).

export const udsStatusBits = [
  'testFailed',
  'testFailedThisOperationCycle',
  'pendingDTC',
  'confirmedDTC',
  'testNotCompletedSinceLastClear',
  'testFailedSinceLastClear',
  'testNotCompletedThisOperationCycle',
  'warningIndicatorRequested',
] as const;

export type UdsStatusBit = (typeof udsStatusBits)[number];

export const udsStatusLabels: Record<UdsStatusBit, string> = {
  testFailed: 'failing now',
  testFailedThisOperationCycle: 'failed this drive cycle',
  pendingDTC: 'pending',
  confirmedDTC: 'confirmed',
  testNotCompletedSinceLastClear: 'test not run since codes were cleared',
  testFailedSinceLastClear: 'failed since codes were cleared',
  testNotCompletedThisOperationCycle: 'test not run this drive cycle',
  warningIndicatorRequested: 'warning lamp requested',
};

/** 0x08 -> confirmedDTC only. `active` lists set bits from bit 0 up. */
export function decodeUdsStatus(byte: number): { bits: Record<UdsStatusBit, boolean>; active: UdsStatusBit[] } {
  if (!Number.isInteger(byte) || byte < 0 || byte > 0xff) throw new RangeError(`UDS status must be a byte 0-255, got ${byte}`);
  const bits = {} as Record<UdsStatusBit, boolean>;
  const active: UdsStatusBit[] = [];
  udsStatusBits.forEach((name, i) => {
    bits[name] = (byte & (1 << i)) !== 0;
    if (bits[name]) active.push(name);
  });
  return { bits, active };
}

/** Inverse of decodeUdsStatus, handy for tests and fixtures. */
export function encodeUdsStatus(active: readonly UdsStatusBit[]): number {
  return active.reduce((byte, name) => byte | (1 << udsStatusBits.indexOf(name)), 0);
}
