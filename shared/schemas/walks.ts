// The cause-walk and cause-tree API contract: what clients send and what the server answers.
// The walk state itself is shared/walk's walkStateSchema; a walk response carries it at top level.
import { z } from 'zod';
import { treeSchema, walkStateSchema } from '../walk';
import { dtcInputSchema, tagSchema } from './cases';

const unique = <T>(list: T[]) => [...new Set(list)];

/** POST /api/walks. Codes are checked with parseDtc (as case notes are), tags folded to kebab-case. */
export const walkStartSchema = z.strictObject({
  platformId: z.number({ error: 'platformId must be a number.' }).int().positive().optional(),
  codes: z.array(dtcInputSchema, { error: 'codes must be a list of trouble codes.' }).max(40, 'At most 40 codes.').default([]).transform(unique),
  symptoms: z.array(tagSchema, { error: 'symptoms must be a list of tags.' }).max(40, 'At most 40 symptom tags.').default([]).transform(unique),
  context: z.array(tagSchema).max(20, 'At most 20 context tags.').optional().transform((c) => unique(c ?? [])),
  query: z.string({ error: 'query must be text.' }).trim().max(500, 'The query is at most 500 characters.').optional(),
});
export type WalkStart = z.infer<typeof walkStartSchema>;

export { stepMarkSchema, type StepMarkInput } from '../walk';

export const walkParamsSchema = z.object({ id: z.coerce.number({ error: 'The walk id is a number.' }).int().positive() });
export const stepParamsSchema = walkParamsSchema.extend({ stepId: z.string().min(1).max(80) });
export const walkListQuerySchema = z.object({ mine: z.enum(['1', '0']).optional() });

export const walkEvidenceSchema = z.object({
  codes: z.array(z.string()),
  cylinders: z.array(z.number()),
  banks: z.object({ bank1: z.array(z.number()), bank2: z.array(z.number()), bothBanks: z.boolean() }).nullable(),
  symptoms: z.array(z.string()),
  context: z.array(z.string()),
  platform: z.object({ fuel: z.string().optional(), induction: z.string().optional(), layout: z.string().optional(), cylinders: z.number().optional() }).nullable(),
});

const personSchema = z.object({ id: z.number(), name: z.string() });
const platformRefSchema = z.object({ id: z.number(), make: z.string(), model: z.string(), engine: z.string() });

/** A walk as the API returns it: the shared/walk state plus who, what car, and the other trees that matched. */
export const precedentSchema = z.object({
  caseId: z.number(),
  title: z.string(),
  /** Global cause id the case was linked to, or null when it never was. */
  cause: z.string().nullable(),
  /** The cause's step title in this walk, when the cause is one of its steps. */
  causeTitle: z.string().nullable(),
  similarity: z.number(),
  sameEngine: z.boolean(),
});
export type PrecedentView = z.infer<typeof precedentSchema>;

export const walkResponseSchema = walkStateSchema.extend({
  id: z.number(),
  /** Row version for optimistic concurrency (the state's own `version` is its format). */
  revision: z.number(),
  owner: personSchema,
  platform: platformRefSchema.nullable(),
  evidence: walkEvidenceSchema,
  query: z.string().nullable(),
  caseId: z.number().nullable(),
  alternatives: z.array(z.object({ treeId: z.string(), title: z.string(), score: z.number(), reasons: z.array(z.string()) })),
  treeReasons: z.array(z.string()),
  /** The shop's confirmed cases closest to this walk (similarity >= 0.7), closest first: "seen before". */
  precedents: z.array(precedentSchema).default([]),
  createdAt: z.string(),
  updatedAt: z.string(),
});
export type WalkResponse = z.infer<typeof walkResponseSchema>;
export type WalkStep = WalkResponse['steps'][number];

export const walkSummarySchema = z.object({
  id: z.number(),
  treeId: z.string(),
  treeTitle: z.string(),
  status: z.enum(['open', 'finished']),
  owner: personSchema,
  platform: platformRefSchema.nullable(),
  codes: z.array(z.string()),
  symptoms: z.array(z.string()),
  confirmedCause: z.string().nullable(),
  nextStep: z.string().nullable(),
  marks: z.number(),
  caseId: z.number().nullable(),
  updatedAt: z.string(),
});
export type WalkSummary = z.infer<typeof walkSummarySchema>;
export const walkListSchema = z.object({ walks: z.array(walkSummarySchema) });
export const writeUpResponseSchema = z.object({ caseId: z.number() });

// ---- cause trees ----

export const treeParamsSchema = z.object({ treeId: z.string().regex(/^[a-z0-9]+(?:-[a-z0-9]+)*$/, 'A tree id is lower-case words joined by hyphens.').max(60) });
export const treeSaveSchema = z.strictObject({ yaml: z.string({ error: 'Send the tree as YAML text in "yaml".' }).min(1, 'The tree is empty.').max(200_000, 'The tree is at most 200,000 characters.') });

export const treeSummarySchema = z.object({
  id: z.string(),
  title: z.string(),
  description: z.string(),
  systems: z.array(z.string()),
  causes: z.number(),
  codes: z.array(z.string()),
  symptoms: z.array(z.string()),
  /** 'content' = the authored file; 'shop' = this shop's edit replaces it. */
  source: z.enum(['content', 'shop']),
  updatedAt: z.string().nullable(),
  updatedBy: personSchema.nullable(),
});
export type TreeSummary = z.infer<typeof treeSummarySchema>;
export const treeListSchema = z.object({ trees: z.array(treeSummarySchema) });

export const treeDetailSchema = treeSummarySchema.extend({ tree: treeSchema, yaml: z.string() });
export type TreeDetail = z.infer<typeof treeDetailSchema>;
export const treeResponseSchema = z.object({ tree: treeDetailSchema });
/** 400 from PUT /api/trees/:treeId: every problem, each "path: message". */
export const treeProblemsSchema = z.object({ error: z.object({ code: z.string(), message: z.string() }), problems: z.array(z.string()) });
