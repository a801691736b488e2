/**
 * The cause-tree file format (content/trees/*.yaml), as a zod schema.
 * The format is documented for authors in content/trees/README.md.
 */
import { z } from 'zod';
import { unitSchema } from '../units';
import { FUELS, INDUCTIONS, LAYOUTS, MISFIRE_PATTERNS } from './evidence';
import { TreeError } from './errors';

export const SYSTEMS = [
  'fuel', 'ignition', 'induction', 'mechanical', 'electrical', 'network', 'sensors', 'exhaust',
  'emissions', 'cooling', 'charging', 'software', 'drivetrain', 'hydraulics', 'brakes', 'steering', 'chassis',
] as const;
export type System = (typeof SYSTEMS)[number];

const id = z
  .string()
  .regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'use lower-case words joined by hyphens, e.g. fuel-pressure-low');
const tag = id;
const text = z.string().trim().min(1);

/** 'P0171', 'P030*', 'U0*', 'P03?0'. */
export const codePatternSchema = z
  .string()
  .regex(/^[PCBU](?:[0-9A-F?]{4}|[0-9A-F?]{0,3}\*)$/i, 'a code pattern is a full code (P0171) or a family ending in * (P030*)')
  .transform((p) => p.toUpperCase());

const list = <T extends z.ZodType>(item: T) => z.array(item).min(1);

export const conditionSchema = z
  .strictObject({
    codes: list(codePatternSchema).optional(),
    allCodes: list(codePatternSchema).optional(),
    symptoms: list(tag).optional(),
    context: list(tag).optional(),
    tags: list(tag).optional(),
    misfire: z.enum(MISFIRE_PATTERNS).optional(),
    fuel: list(z.enum(FUELS)).optional(),
    induction: list(z.enum(INDUCTIONS)).optional(),
    layout: list(z.enum(LAYOUTS)).optional(),
  })
  .refine((c) => Object.keys(c).length > 0, 'a condition needs at least one key');
export type Condition = z.output<typeof conditionSchema>;

export const specSchema = z
  .strictObject({
    min: z.number().finite().optional(),
    max: z.number().finite().optional(),
    unit: unitSchema,
    text: text.optional(),
  })
  .refine((s) => s.min !== undefined || s.max !== undefined, 'a spec needs min, max or both')
  .refine((s) => s.min === undefined || s.max === undefined || s.min <= s.max, 'spec min is above max');
export type TreeSpec = z.output<typeof specSchema>;

export const testStepSchema = z.strictObject({
  do: text,
  tools: z.array(text).default([]),
  expect: text,
  spec: specSchema.optional(),
});
export type TestStep = z.output<typeof testStepSchema>;

export const modifierSchema = z.strictObject({
  when: conditionSchema,
  factor: z.number().positive().finite(),
  why: text,
});
export type Modifier = z.output<typeof modifierSchema>;

/** How far a cause reaches: one cylinder, one bank, or the whole engine. Drives the misfire-pattern rules. */
export const SCOPES = ['cylinder', 'bank', 'shared'] as const;
export type Scope = (typeof SCOPES)[number];

export const causeSchema = z.strictObject({
  id,
  title: text,
  about: text.optional(),
  scope: z.enum(SCOPES).optional(),
  weight: z.number().positive().finite(),
  minutes: z.number().positive().finite(),
  test: testStepSchema,
  caution: text.optional(),
  appliesWhen: conditionSchema.optional(),
  modifiers: z.array(modifierSchema).default([]),
});
export type Cause = z.output<typeof causeSchema>;

export const branchSchema = z.strictObject({
  system: z.enum(SYSTEMS),
  title: text.optional(),
  causes: list(causeSchema),
});

export const appliesToSchema = z
  .strictObject({
    codes: z.array(codePatternSchema).default([]),
    symptoms: z.array(tag).default([]),
    context: z.array(tag).default([]),
    fuel: list(z.enum(FUELS)).optional(),
    induction: list(z.enum(INDUCTIONS)).optional(),
    layout: list(z.enum(LAYOUTS)).optional(),
  })
  .refine(
    (a) => a.codes.length + a.symptoms.length + a.context.length > 0,
    'appliesTo needs codes, symptoms or context, or the tree can never be chosen',
  );

export const treeSchema = z
  .strictObject({
    id,
    title: text,
    description: text,
    appliesTo: appliesToSchema,
    branches: list(branchSchema),
  })
  .superRefine((tree, ctx) => {
    const seen = new Set<string>();
    tree.branches.forEach((branch, b) =>
      branch.causes.forEach((cause, c) => {
        if (seen.has(cause.id)) {
          ctx.addIssue({ code: 'custom', message: `cause id "${cause.id}" is used twice`, path: ['branches', b, 'causes', c, 'id'] });
        }
        seen.add(cause.id);
      }),
    );
  });

export type Tree = z.output<typeof treeSchema>;

/** A cause with its branch's system and its global id `<treeId>/<causeId>`. */
export type TreeCause = Cause & { system: System; treeId: string; globalId: string };

export const globalCauseId = (treeId: string, causeId: string) => `${treeId}/${causeId}`;

export function listCauses(tree: Tree): TreeCause[] {
  return tree.branches.flatMap((branch) =>
    branch.causes.map((cause) => ({
      ...cause,
      system: branch.system,
      treeId: tree.id,
      globalId: globalCauseId(tree.id, cause.id),
    })),
  );
}

/** Validate a tree read from YAML (the caller parses the file). Throws TreeError listing every problem. */
export function parseTree(yamlObject: unknown): Tree {
  const result = treeSchema.safeParse(yamlObject);
  if (result.success) return result.data;
  const problems = result.error.issues.map((issue) => `${issue.path.join('.') || '(root)'}: ${issue.message}`);
  const treeId =
    typeof yamlObject === 'object' && yamlObject !== null && 'id' in yamlObject ? String(yamlObject.id) : 'unknown';
  throw new TreeError(`cause tree "${treeId}" is not valid:\n${problems.join('\n')}`, problems);
}
