// Cause suggestions from a write-up, precedents from the shop's history, and the "after work"
// reasoning, measured on the demo shop's own cases (content/cases) and small made-up ones.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readDemoHistory } from '../../../server/seed/demo-history';
import {
  clearSuggestion,
  evidenceFrom,
  pickPrecedents,
  priorsFor,
  scoreHistory,
  selectTrees,
  startWalk,
  suggestCauses,
  type Tree,
} from '../../../shared/walk';
import { evidence, loadTree } from './helpers';

const content = path.resolve(import.meta.dirname, '../../../content');
const demo = readDemoHistory(content);
const TREE_IDS = ['brakes', 'cam-crank', 'charging', 'clutch-hydraulics', 'lean', 'low-boost', 'misfire', 'no-comm', 'no-program', 'noise-after-work', 'power-steering', 'rich', 'wheel-speed'];
const trees: Tree[] = TREE_IDS.map(loadTree);
const linked = demo.cases.filter((c) => c.cause);
const vt27 = demo.platforms.find((p) => p.engine === 'VT27')!;

describe('suggestCauses', () => {
  it('finds the linked cause of the demo cases from their write-up: first for 9 in 10, in the top three for all', () => {
    const ranks = linked.map((c) => {
      const s = suggestCauses(trees, { title: c.title, rootCause: c.file.rootCause, fix: c.file.fix }, evidenceFrom(c, c.platform));
      return s.findIndex((x) => x.cause === c.cause);
    });
    expect(linked.length).toBeGreaterThanOrEqual(50);
    expect(ranks.filter((r) => r === 0).length / ranks.length).toBeGreaterThanOrEqual(0.9);
    expect(ranks.every((r) => r >= 0 && r < 3)).toBe(true);
  });

  it('never links a wrong cause by itself on the demo cases, and links most of them', () => {
    const auto = linked.map((c) => ({ c, pick: clearSuggestion(suggestCauses(trees, { rootCause: c.file.rootCause, fix: c.file.fix }, evidenceFrom(c, c.platform))) }));
    const picked = auto.filter((a) => a.pick);
    expect(picked.every((a) => a.pick!.cause === a.c.cause)).toBe(true);
    expect(picked.length / linked.length).toBeGreaterThanOrEqual(0.6);
  });

  it('reads workshop words and J1930 terms: a "loom" is a harness, "MAF" is the air-flow sensor', () => {
    const ev = evidence({ codes: ['P0302', 'P0305'], platform: { fuel: 'petrol' } });
    const loom = suggestCauses(trees, { rootCause: 'Coil loom branches crossed when refitted, connectors on the wrong coils' }, ev);
    expect(loom[0]?.cause).toBe('misfire/ignition-harness');
    const maf = suggestCauses(trees, { rootCause: 'MAF contaminated with oil from an over-oiled filter' }, evidence({ codes: ['P0171'] }));
    expect(maf[0]?.cause).toMatch(/\/maf-contaminated$/);
  });

  it('scores in 0..1, best first, and links nothing when the write-up says nothing a tree knows', () => {
    const s = suggestCauses(trees, { rootCause: 'Customer fault, nothing found' }, evidence({ symptoms: ['misfire'] }));
    for (let i = 1; i < s.length; i++) expect(s[i - 1]!.score).toBeGreaterThanOrEqual(s[i]!.score);
    for (const x of s) expect(x.score).toBeGreaterThan(0), expect(x.score).toBeLessThan(1);
    expect(clearSuggestion(s)).toBeNull();
  });

  it('leaves out causes that cannot apply to the platform (no ignition coil on a diesel)', () => {
    const s = suggestCauses(trees, { rootCause: 'Ignition coil breaking down on cylinder 2' }, evidence({ codes: ['P0302'], platform: { fuel: 'diesel' } }), 20);
    expect(s.map((x) => x.cause)).not.toContain('misfire/coil');
  });
});

describe('precedents and sharp similarity on the demo shop', () => {
  const walkEv = evidenceFrom({ codes: ['P0302', 'P0305'], symptoms: ['misfire', 'rough-idle'], context: ['after-timing-work'] }, vt27);
  const history = demo.cases.filter((c) => c.confirmed);
  const scored = scoreHistory(walkEv, vt27, history);
  const misfire = selectTrees(trees, walkEv)[0]!.tree;
  const confirmed = scored.flatMap((c) => (c.cause?.startsWith('misfire/') ? [{ ...c, cause: c.cause }] : []));

  it('opens the VT27 P0302 + P0305 walk after timing work with the crossed coil connectors case, closest first', () => {
    const precedents = pickPrecedents(scored);
    expect(precedents[0]).toMatchObject({ caseId: '0050-vt27-misfire-cyl-2-5-after-timing-belt-coil-connectors-crossed', cause: 'misfire/ignition-harness', sameEngine: true });
    for (let i = 1; i < precedents.length; i++) expect(precedents[i - 1]!.similarity).toBeGreaterThanOrEqual(precedents[i]!.similarity);
    for (const p of precedents) expect(p.similarity).toBeGreaterThanOrEqual(0.7);
  });

  it('ranks the crossed coil connectors first on that walk, above cam timing', () => {
    expect(misfire.id).toBe('misfire');
    const walk = startWalk(misfire, walkEv, { confirmedCases: confirmed });
    expect(walk.nextStepId).toBe('ignition-harness');
    const harness = walk.steps.find((s) => s.id === 'ignition-harness')!;
    expect(harness.evidence[0]?.caseId).toBe('0050-vt27-misfire-cyl-2-5-after-timing-belt-coil-connectors-crossed');
    expect(harness.probability).toBeGreaterThan(walk.steps.find((s) => s.id === 'cam-timing')!.probability);
  });

  it('counts the same-engine precedent far more than the same-family cam-timing case on another engine', () => {
    const exact = scored.find((c) => c.caseId.toString().startsWith('0050-'))!;
    const family = scored.find((c) => c.caseId.toString().startsWith('0010-'))!;
    expect(exact.similarity).toBeGreaterThan(0.85);
    expect(family.similarity).toBeLessThan(0.7);
    const only = (c: typeof exact) => startWalk(misfire, walkEv, { confirmedCases: [{ ...c, cause: c.cause! }] });
    const plain = startWalk(misfire, walkEv);
    const rise = (w: ReturnType<typeof startWalk>, id: string) => w.steps.find((s) => s.id === id)!.prior - plain.steps.find((s) => s.id === id)!.prior;
    expect(rise(only(exact), 'ignition-harness')).toBeGreaterThan(5 * rise(only(family), 'cam-timing'));
  });
});

describe('after-work context raises what the work disturbed', () => {
  const both = evidence({ codes: ['P0302', 'P0305'], cylinders: [2, 5], banks: { bank1: [2], bank2: [5], bothBanks: true }, platform: { fuel: 'petrol' } });
  const misfire = loadTree('misfire');
  const prior = (ev: typeof both, id: string) => priorsFor(misfire, ev).find((p) => p.causeId === id)!;

  it('keeps "misfires on both banks make a part on one cylinder unlikely" off a harness the work disturbed', () => {
    const plain = prior(both, 'ignition-harness');
    expect(plain.why).toContain('misfires on both banks make a part on one cylinder unlikely');
    const afterWork = prior({ ...both, context: ['after-timing-work'] }, 'ignition-harness');
    expect(afterWork.why.join(' ')).not.toMatch(/make a part on one cylinder unlikely/);
    expect(afterWork.why.join(' ')).toMatch(/connectors crossed|do not make it less likely/);
    expect(afterWork.factor).toBeGreaterThan(plain.factor * 5);
    // a coil the work did not touch still gets the both-banks reasoning
    expect(prior({ ...both, context: ['after-timing-work'] }, 'coil').why).toContain('misfires on both banks make a part on one cylinder unlikely');
  });

  it('raises connectors, hoses and sensors after timing, belt or engine work, not only cam timing', () => {
    for (const context of ['after-timing-work', 'after-belt-job', 'after-engine-swap']) {
      const ev = { ...both, context: [context] };
      for (const id of ['ignition-harness', 'injector-harness', 'vacuum-leak']) expect(prior(ev, id).factor, `${id} ${context}`).toBeGreaterThan(prior(both, id).factor);
    }
    const camCrank = loadTree('cam-crank');
    const sensor = (ctx: string[]) => priorsFor(camCrank, evidence({ codes: ['P0340'], context: ctx })).find((p) => p.causeId === 'cmp-sensor')!.factor;
    expect(sensor(['after-timing-work'])).toBeGreaterThan(sensor([]));
    const boost = loadTree('low-boost');
    const pipe = (ctx: string[]) => priorsFor(boost, evidence({ codes: ['P0299'], context: ctx })).find((p) => p.causeId === 'charge-pipe-leak')!.factor;
    expect(pipe(['after-engine-swap'])).toBeGreaterThan(pipe([]));
  });
});
