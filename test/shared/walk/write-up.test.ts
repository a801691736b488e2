import { describe, expect, it } from 'vitest';
import { buildWriteUp, markStep, startWalk } from '../../../shared/walk';
import { evidence, loadTree } from './helpers';

const ev = evidence({
  codes: ['P0300', 'P0302', 'P0305'],
  cylinders: [2, 5],
  banks: { bank1: [5], bank2: [2], bothBanks: true },
  symptoms: ['rough-idle', 'flashing-mil'],
  context: ['after-timing-work'],
  platform: { fuel: 'petrol', layout: 'V6', cylinders: 6 },
});

function finishedWalk() {
  let walk = startWalk(loadTree('misfire'), ev);
  walk = markStep(walk, 'vacuum-leak', {
    state: 'tested',
    outcome: 'no_fault',
    measurement: { value: 19, unit: 'inHg' },
    note: 'Smoke test clean.\nNo leaks <at all>.',
  });
  walk = markStep(walk, 'coil', { state: 'ruled_out', note: 'Both banks misfire; coils are new.' });
  walk = markStep(walk, 'cam-timing', {
    state: 'tested',
    outcome: 'fault_found',
    measurement: { value: 14, unit: 'deg' }, // one tooth off, common practice, no source
  });
  return walk;
}

describe('buildWriteUp', () => {
  const md = buildWriteUp(finishedWalk(), ev);

  it('lists the evidence: codes, cylinders by bank, symptoms, context and platform', () => {
    expect(md).toContain('- Codes: `P0300`, `P0302`, `P0305`');
    expect(md).toContain('- Misfiring cylinders: 2, 5 (bank 1: 5; bank 2: 2)');
    expect(md).toContain('- Symptoms: rough-idle, flashing-mil');
    expect(md).toContain('- Context: after-timing-work');
    expect(md).toContain('- Platform: petrol, V6, 6 cylinders');
  });

  it('lists the steps in the order they were done, with readings and verdicts', () => {
    const lines = md.split('\n').filter((l) => /^\d+\. /.test(l));
    expect(lines).toHaveLength(3);
    expect(lines[0]).toMatch(/^1\. \*\*Vacuum \(unmetered air\) leak\*\* \(induction\): tested, no fault\./);
    expect(lines[0]).toContain('Reading `19 inHg`, spec `17–21 inHg`: in spec.');
    expect(lines[1]).toMatch(/^2\. .*ruled out without a test\. Reason: Both banks misfire; coils are new\./);
    expect(lines[2]).toMatch(/^3\. .*tested, fault found\. Reading `14 deg`, spec `±4 deg`: out of spec\./);
  });

  it('keeps notes on one line and does not pass raw HTML through', () => {
    expect(md).toContain('Note: Smoke test clean. No leaks &lt;at all>.');
    expect(md).not.toContain('<at all>');
  });

  it('names the confirmed cause with its global id', () => {
    expect(md).toContain('## Confirmed cause\n\nCam timing off (jumped, stretched or set wrong) (`misfire/cam-timing`)');
  });

  it('carries the cautions of the steps that were tested, not of those ruled out', () => {
    const cautions = md.slice(md.indexOf('## Cautions that applied'));
    expect(cautions).toMatch(/interference engine/);
    expect(cautions).toMatch(/smoke machine/);
    expect(cautions).not.toMatch(/20,000 volts/);
  });

  it('says so when nothing has been marked yet', () => {
    const fresh = buildWriteUp(startWalk(loadTree('misfire'), ev), ev);
    expect(fresh).toContain('No steps marked yet.');
    expect(fresh).toContain('Not confirmed yet.');
    expect(fresh).not.toContain('## Cautions');
  });
});
