import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parse } from 'yaml';
import { describe, expect, it } from 'vitest';
import { decodeMonitorStatus, driveCycleGuideSchema, incompleteMonitors, monitorKeys, nextSteps } from '../../../shared/readiness';

const file = path.resolve(import.meta.dirname, '../../../content/readiness/drive-cycles.yaml');
const guide = driveCycleGuideSchema.parse(parse(readFileSync(file, 'utf8')));

describe('content/readiness/drive-cycles.yaml', () => {
  it('has conditions for every monitor PID $01 can report', () => {
    expect(Object.keys(guide.monitors).sort()).toEqual([...monitorKeys].sort());
  });

  it('defers road tests to the manufacturer, local regulations and licensed practice, with a second person on the tool', () => {
    expect(guide.roadTestCaution).toMatch(/manufacturer's procedure, local regulations and licensed practice/);
    expect(guide.roadTestCaution).toMatch(/two people/);
    expect(guide.roadTestCaution).toMatch(/traffic law/);
  });

  it('rejects an unknown monitor key and a monitor without conditions', () => {
    const base = { note: 'n', roadTestCaution: 'follow the manufacturer' };
    expect(driveCycleGuideSchema.safeParse({ ...base, monitors: { catalist: { conditions: ['x'] } } }).error?.issues[0]?.message).toMatch(/"catalist" is not a monitor key/);
    expect(driveCycleGuideSchema.safeParse({ ...base, monitors: { evap: { conditions: [] } } }).success).toBe(false);
  });
});

describe('nextSteps', () => {
  it('gives each incomplete monitor its conditions and the caution, EVAP with its own caution first', () => {
    // D=0x24: EVAP and O2 sensor incomplete (hand-worked, SAE J1979 PID $01 layout from memory)
    const steps = nextSteps(incompleteMonitors(decodeMonitorStatus([0, 0x07, 0x65, 0x24])), guide);
    expect(steps.map((s) => s.monitor)).toEqual(['evap', 'oxygen-sensor']);
    expect(steps[0]!.conditions.join(' ')).toMatch(/cold soak/i);
    expect(steps[0]!.caution).toMatch(/^Do not overfill.*two people/s);
    expect(steps[1]!.caution).toMatch(/^Road test with two people/);
    // the deferral once, at the end (shared/walk/cautions)
    for (const s of steps) expect(s.caution.match(/Follow the manufacturer's procedure, local regulations and licensed practice\./g)).toHaveLength(1);
  });
});
