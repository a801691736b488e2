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

// Every list in a tree has a cap well above what the shipped trees use (at most 19 codes, 11 tags,
// 5 causes a branch, 4 branches, 4 tools, 4 modifiers), so a saved tree cannot hold the server
// (issue 15, finding 7). Common practice, no source.
export const TREE_LIST_LIMITS = { codes: 60, tags: 40, branches: 20, causes: 30, tools: 12, modifiers: 12 } as const;

const capped = <T extends z.ZodType>(item: T, max: number, what: string) => z.array(item).max(max, `at most ${max} ${what}`);
const list = <T extends z.ZodType>(item: T, max: number, what: string) => capped(item, max, what).min(1);
const codeList = (min: 0 | 1) => (min ? list : capped)(codePatternSchema, TREE_LIST_LIMITS.codes, 'code patterns');
const tagList = (min: 0 | 1) => (min ? list : capped)(tag, TREE_LIST_LIMITS.tags, 'tags');
/** A list of enum values, each at most once, so never longer than the enum. */
const enumList = <const V extends readonly [string, ...string[]]>(values: V) => list(z.enum(values), values.length, 'values');

export const conditionSchema = z
  .strictObject({
    codes: codeList(1).optional(),
    allCodes: codeList(1).optional(),
    symptoms: tagList(1).optional(),
    context: tagList(1).optional(),
    tags: tagList(1).optional(),
    misfire: z.enum(MISFIRE_PATTERNS).optional(),
    fuel: enumList(FUELS).optional(),
    induction: enumList(INDUCTIONS).optional(),
    layout: enumList(LAYOUTS).optional(),
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
  tools: capped(text, TREE_LIST_LIMITS.tools, 'tools').default([]),
  expect: text,
  spec: specSchema.optional(),
});
export type TestStep = z.output<typeof testStepSchema>;

export const modifierSchema = z.strictObject({
  when: conditionSchema,
  factor: z.number().positive().finite(),
  why: text,
  /**
   * The modifier says recent work disturbed the part (connectors unplugged, a loom or hose
   * moved). Such a fault can reach cylinders that share nothing else (two connectors crossed),
   * so a cylinder part's misfire-pattern penalty is not applied while this fires.
   */
  disturbedByWork: z.boolean().optional(),
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
  modifiers: capped(modifierSchema, TREE_LIST_LIMITS.modifiers, 'modifiers').default([]),
});
export type Cause = z.output<typeof causeSchema>;

export const branchSchema = z.strictObject({
  system: z.enum(SYSTEMS),
  title: text.optional(),
  causes: list(causeSchema, TREE_LIST_LIMITS.causes, 'causes in a branch'),
});

export const appliesToSchema = z
  .strictObject({
    codes: codeList(0).default([]),
    symptoms: tagList(0).default([]),
    context: tagList(0).default([]),
    fuel: enumList(FUELS).optional(),
    induction: enumList(INDUCTIONS).optional(),
    layout: enumList(LAYOUTS).optional(),
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
    branches: list(branchSchema, TREE_LIST_LIMITS.branches, 'branches'),
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
