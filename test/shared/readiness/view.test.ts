import { describe, expect, it } from 'vitest';
import { assessReadiness, compareReadouts, decodeMonitorStatus, readinessRule, readinessView } from '../../../shared/readiness';

// Hand-worked PID $01 bytes (SAE J1979 layout, from memory).
const rule = readinessRule('us-common');

describe('readinessView', () => {
  it('groups the counted monitors first with incomplete ones on top, and lists unsupported ones apart', () => {
    const v = readinessView(assessReadiness(decodeMonitorStatus([0, 0x07, 0x65, 0x24]), rule, 2010));
    expect(v.groups.map((g) => g.title)).toEqual(['Non-continuous monitors (counted by the rule)', 'Continuous monitors']);
    expect(v.groups[0]!.rows.map((r) => [r.name, r.stateLabel])).toEqual([
      ['Evaporative system', 'Incomplete'],
      ['Oxygen sensor', 'Incomplete'],
      ['Catalyst', 'Complete'],
      ['Oxygen sensor heater', 'Complete'],
    ]);
    expect(v.notSupported).toEqual(['Heated catalyst', 'Secondary air system', 'A/C refrigerant', 'EGR / VVT system']);
    expect(v).toMatchObject({ headline: 'Not ready: 2 incomplete', tone: 'warn', milLabel: 'MIL: off', codesLabel: '0 confirmed codes', ruleName: 'Rule: Common US practice' });
  });

  it('says MIL on in red', () => {
    const v = readinessView(assessReadiness(decodeMonitorStatus([0x81, 0x07, 0x65, 0]), rule, 2010));
    expect(v).toMatchObject({ headline: 'Not ready: MIL on', tone: 'bad', milTone: 'bad', codesLabel: '1 confirmed code' });
  });

  it('reads as ready when the shop rule allows the one incomplete monitor', () => {
    expect(readinessView(assessReadiness(decodeMonitorStatus([0, 0x07, 0x65, 0x04]), rule, 2010)).headline).toBe('Ready under the shop rule, 1 incomplete');
  });
});

describe('compareReadouts (before and after a drive cycle)', () => {
  it('names what finished, what is still incomplete and what reset', () => {
    const before = decodeMonitorStatus([0, 0x07, 0x65, 0x25]); // catalyst, EVAP, O2 sensor incomplete
    const after = decodeMonitorStatus([0, 0x07, 0x65, 0x44]); // EVAP, O2 heater incomplete
    expect(compareReadouts(before, after)).toEqual({
      finished: ['Catalyst', 'Oxygen sensor'],
      stillIncomplete: ['Evaporative system'],
      reset: ['Oxygen sensor heater'],
    });
  });
});
