/// <reference types="node" />
import { readdirSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { selectTrees } from '../../../shared/walk';
import { evidence, loadTree } from './helpers';

const ids = readdirSync(path.resolve(import.meta.dirname, '../../../content/trees'))
  .filter((f) => f.endsWith('.yaml'))
  .map((f) => f.replace(/\.yaml$/, ''));
const trees = ids.map(loadTree);
const first = (ev: Parameters<typeof selectTrees>[1]) => selectTrees(trees, ev)[0]?.tree.id;

describe('selectTrees', () => {
  it('picks the tree each kind of code belongs to', () => {
    expect(first(evidence({ codes: ['P0302'] }))).toBe('misfire');
    expect(first(evidence({ codes: ['P0171', 'P0174'] }))).toBe('lean');
    expect(first(evidence({ codes: ['P0175'] }))).toBe('rich');
    expect(first(evidence({ codes: ['P0016'] }))).toBe('cam-crank');
    expect(first(evidence({ codes: ['U0100'] }))).toBe('no-comm');
    expect(first(evidence({ codes: ['C0035'] }))).toBe('wheel-speed');
    expect(first(evidence({ codes: ['P0299'] }))).toBe('low-boost');
  });

  it('matches a code with a failure-type byte by its base code', () => {
    expect(first(evidence({ codes: ['p0301-00'] }))).toBe('misfire');
  });

  it('picks symptom-led trees from symptoms and context', () => {
    expect(first(evidence({ symptoms: ['pedal-pulsation'] }))).toBe('brakes');
    expect(first(evidence({ symptoms: ['Heavy steering'] }))).toBe('power-steering');
    expect(first(evidence({ symptoms: ['squeal'], context: ['after-belt-work'] }))).toBe('noise-after-work');
  });

  it('ranks a tree matched on code and context above one matched on the code alone', () => {
    const matches = selectTrees(trees, evidence({ codes: ['P0016', 'P0300'], context: ['after-timing-work'] }));
    expect(matches[0]?.tree.id).toBe('cam-crank');
    expect(matches.map((m) => m.tree.id)).toContain('misfire');
    expect(matches[0]?.reasons).toEqual(['code P0016', 'context after-timing-work']);
  });

  it('leaves out a turbo tree for an engine known to be naturally aspirated', () => {
    const ev = evidence({ codes: ['P0299'] });
    expect(selectTrees(trees, { ...ev, platform: { induction: 'naturally aspirated' } }).map((m) => m.tree.id)).not.toContain('low-boost');
    expect(selectTrees(trees, { ...ev, platform: { induction: 'turbocharged' } })[0]?.tree.id).toBe('low-boost');
  });

  it('does not offer engine trees for an electric platform', () => {
    const ids = selectTrees(trees, evidence({ symptoms: ['rough-idle', 'hesitation'], platform: { fuel: 'electric' } })).map((m) => m.tree.id);
    expect(ids).not.toContain('misfire');
    expect(ids).not.toContain('lean');
  });

  it('returns nothing when no tree matches', () => {
    expect(selectTrees(trees, evidence({ codes: ['B1234'], symptoms: ['strange-smell-in-boot'] }))).toEqual([]);
  });
});
