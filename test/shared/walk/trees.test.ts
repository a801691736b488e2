/// <reference types="node" />
// Every authored tree in content/trees must validate, and every cause id the demo
// case notes rely on must exist. The files are read with node:fs here, in the test only.
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { parse } from 'yaml';
import { describe, expect, it } from 'vitest';
import { listCauses, parseTree, type Tree } from '../../../shared/walk';

const dir = path.resolve(import.meta.dirname, '../../../content/trees');
const files = readdirSync(dir).filter((f) => f.endsWith('.yaml'));

let cache: Tree[] | undefined;
function loadAll(): Tree[] {
  cache ??= files.map((f) => parseTree(parse(readFileSync(path.join(dir, f), 'utf8'))));
  return cache;
}

/** The ids the demo case notes reference (shared contract between helpers). */
const CONTRACT: Record<string, string[]> = {
  misfire: ['coil', 'spark-plug', 'injector', 'low-compression', 'cam-timing', 'fuel-pressure-low', 'vacuum-leak', 'ignition-harness', 'injector-harness', 'maf-contaminated'],
  lean: ['vacuum-leak', 'maf-contaminated', 'fuel-pressure-low', 'injector-restricted', 'exhaust-leak-upstream', 'pcv-failed', 'intake-gasket'],
  rich: ['injector-leaking', 'fuel-pressure-high', 'ect-sensor', 'purge-valve-stuck', 'maf-overreading'],
  'low-boost': ['charge-pipe-leak', 'intercooler-leak', 'wastegate-stuck-open', 'bypass-valve-leak', 'turbo-worn', 'boost-sensor', 'boost-control-solenoid'],
  'cam-crank': ['timing-one-tooth-off', 'cmp-sensor', 'ckp-sensor', 'phaser-stuck', 'reluctor-damaged', 'timing-chain-stretched'],
  'no-comm': ['bus-termination', 'module-ground', 'module-power', 'connector-corrosion', 'bus-short', 'module-failed', 'gateway-fault'],
  'wheel-speed': ['sensor-debris-gap', 'tone-ring-cracked', 'sensor-wiring-chafed', 'hub-bearing-play', 'sensor-failed'],
  'no-program': ['low-supply-voltage', 'wrong-calibration', 'interface-connection', 'security-access', 'module-internal'],
  'noise-after-work': ['heat-shield-loose', 'mount-not-torqued', 'belt-misrouted', 'tensioner-failed', 'exhaust-clamp', 'coolant-hose-clamp', 'vacuum-line-off'],
  'clutch-hydraulics': ['master-bypass', 'slave-leak', 'air-in-line', 'fluid-contaminated'],
  brakes: ['pad-glazed', 'rotor-runout', 'slide-pins-seized', 'hose-collapsed', 'caliper-piston-sticking'],
  'power-steering': ['fluid-low-leak', 'pump-worn', 'air-in-system', 'rack-internal-leak'],
};

/** Words that mark a step that can hurt someone; such a step must carry a caution. */
const HAZARDS = /fuel pressure|relieve|high.voltage|secondary|lift|stands|jack|hot coolant|radiator cap|timing mark|rotat|belt|fan|hot exhaust|battery charger|pressure test/i;

describe('authored cause trees', () => {
  it('has at least 12 tree files, each validating against the tree schema', () => {
    expect(files.length).toBeGreaterThanOrEqual(12);
    for (const f of files) {
      expect(() => parseTree(parse(readFileSync(path.join(dir, f), 'utf8'))), f).not.toThrow();
    }
  });

  it('names each file after its tree id and uses each tree id once', () => {
    const trees = loadAll();
    expect(trees.map((t) => `${t.id}.yaml`).sort()).toEqual([...files].sort());
  });

  it('contains every cause id in the contract with the demo case notes', () => {
    const byId = new Map(loadAll().map((t) => [t.id, new Set(listCauses(t).map((c) => c.id))]));
    const missing = Object.entries(CONTRACT).flatMap(([treeId, ids]) =>
      ids.filter((id) => !byId.get(treeId)?.has(id)).map((id) => `${treeId}/${id}`),
    );
    expect(missing).toEqual([]);
  });

  it('gives a caution to every step whose procedure involves a hazard', () => {
    const hazardous = loadAll()
      .flatMap(listCauses)
      .filter((c) => HAZARDS.test(`${c.test.do} ${c.test.tools.join(' ')}`));
    expect(hazardous.length).toBeGreaterThan(20);
    expect(hazardous.filter((c) => !c.caution).map((c) => c.globalId)).toEqual([]);
  });

  it('words every caution as a caution that defers to the manufacturer', () => {
    for (const cause of loadAll().flatMap(listCauses)) {
      if (!cause.caution) continue;
      expect(cause.caution, cause.globalId).toMatch(/^Caution:/);
      expect(cause.caution, cause.globalId).toMatch(/manufacturer/i);
    }
  });

  it('gives every tree at least four causes to choose between', () => {
    for (const tree of loadAll()) expect(listCauses(tree).length, tree.id).toBeGreaterThanOrEqual(4);
  });
});
