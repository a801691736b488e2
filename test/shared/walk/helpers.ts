/// <reference types="node" />
// Test helpers: real trees read from content/ (node:fs in tests only) and small synthetic trees.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { parse } from 'yaml';
import { emptyEvidence, parseTree, type Tree, type WalkEvidence } from '../../../shared/walk';

const dir = path.resolve(import.meta.dirname, '../../../content/trees');

export function loadTree(id: string): Tree {
  return parseTree(parse(readFileSync(path.join(dir, `${id}.yaml`), 'utf8')));
}

export function evidence(partial: Partial<WalkEvidence> = {}): WalkEvidence {
  return { ...emptyEvidence(), ...partial };
}

export interface SyntheticCause {
  id: string;
  weight: number;
  minutes: number;
  spec?: { min?: number; max?: number; unit: string };
  caution?: string;
}

/** A one-branch tree whose weights are the probabilities wanted (they are normalised anyway). */
export function syntheticTree(causes: SyntheticCause[], id = 'test-tree'): Tree {
  return parseTree({
    id,
    title: 'Test tree',
    description: 'A tree built inside a test.',
    appliesTo: { symptoms: ['test'] },
    branches: [
      {
        system: 'mechanical',
        causes: causes.map((c) => ({
          id: c.id,
          title: `Cause ${c.id}`,
          weight: c.weight,
          minutes: c.minutes,
          test: { do: `Test cause ${c.id}.`, expect: 'No fault.', ...(c.spec ? { spec: c.spec } : {}) },
          ...(c.caution ? { caution: c.caution } : {}),
        })),
      },
    ],
  });
}

/** references.md §5 worked check: p = 0.5, 0.3, 0.2; c = 10, 2, 5 minutes. */
export const WORKED_EXAMPLE: SyntheticCause[] = [
  { id: 'c1', weight: 0.5, minutes: 10 },
  { id: 'c2', weight: 0.3, minutes: 2 },
  { id: 'c3', weight: 0.2, minutes: 5 },
];
