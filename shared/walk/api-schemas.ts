/** Request and stored-state schemas for the walk API and the offline copy in the browser. */
import { z } from 'zod';
import { unitSchema } from '../units';
import { normaliseTag } from './evidence';
import { SYSTEMS } from './tree-schema';
import type { Walk } from './walk';

const dtc = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[PCBU][0-3][0-9A-F]{3}(?:-[0-9A-F]{2})?$/, 'a trouble code looks like P0302 or P0302-00');

const tag = z
  .string()
  .max(60)
  .transform(normaliseTag)
  .refine((t) => t.length > 0, 'a tag needs letters or digits');

export const walkCreateSchema = z.strictObject({
  platformId: z.number().int().positive().optional(),
  codes: z.array(dtc).max(40).default([]),
  symptoms: z.array(tag).max(40).default([]),
  context: z.array(tag).max(40).optional(),
  query: z.string().trim().max(500).optional(),
});
export type WalkCreate = z.output<typeof walkCreateSchema>;

export const measurementSchema = z.strictObject({ value: z.number().finite(), unit: unitSchema });

const stepStateSchema = z.enum(['open', 'tested', 'ruled_out']);
const outcomeSchema = z.enum(['fault_found', 'no_fault']);

/** Mirrors markStep's own checks so the API can answer with field errors before touching the walk. */
export const stepMarkSchema = z
  .strictObject({
    state: stepStateSchema,
    outcome: outcomeSchema.optional(),
    measurement: measurementSchema.optional(),
    note: z.string().trim().max(2000).optional(),
  })
  .superRefine((mark, ctx) => {
    if (mark.state === 'tested' && !mark.outcome) {
      ctx.addIssue({ code: 'custom', path: ['outcome'], message: 'a tested step needs an outcome' });
    }
    if (mark.state !== 'tested' && mark.outcome) {
      ctx.addIssue({ code: 'custom', path: ['outcome'], message: 'only a tested step has an outcome' });
    }
    if (mark.state !== 'tested' && mark.measurement) {
      ctx.addIssue({ code: 'custom', path: ['measurement'], message: 'a measurement is only recorded with a test' });
    }
    if (mark.state === 'ruled_out' && !mark.note) {
      ctx.addIssue({ code: 'custom', path: ['note'], message: 'say why the cause is ruled out without a test' });
    }
  });
export type StepMarkInput = z.output<typeof stepMarkSchema>;

const specSchema = z.object({
  min: z.number().optional(),
  max: z.number().optional(),
  unit: unitSchema,
  text: z.string().optional(),
});

const stepSchema = z.object({
  id: z.string(),
  cause: z.string(),
  title: z.string(),
  about: z.string().optional(),
  system: z.enum(SYSTEMS),
  test: z.object({ do: z.string(), tools: z.array(z.string()), expect: z.string() }),
  spec: specSchema.optional(),
  costMinutes: z.number().positive(),
  probability: z.number().min(0).max(1),
  prior: z.number().min(0).max(1),
  state: stepStateSchema,
  outcome: outcomeSchema.optional(),
  measurement: measurementSchema.optional(),
  verdict: z.object({ verdict: z.enum(['in', 'out']), valueInSpecUnit: z.number(), reason: z.string() }).optional(),
  note: z.string().optional(),
  caution: z.string().optional(),
  evidence: z.array(z.object({ caseId: z.union([z.string(), z.number()]), title: z.string() })),
  why: z.array(z.string()),
  markOrder: z.number().int().optional(),
});

/** A walk read back from JSON (database row or browser storage). */
export const walkStateSchema = z.object({
  version: z.literal(1),
  treeId: z.string(),
  treeTitle: z.string(),
  status: z.enum(['open', 'finished']),
  confirmedStepId: z.string().optional(),
  steps: z.array(stepSchema),
  nextStepId: z.string().optional(),
  expectedMinutes: z.object({ recommended: z.number(), byLikelihood: z.number() }),
  marks: z.number().int().min(0),
});

// Compile-time check that the schema and the Walk type agree.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const _walkSchemaMatches: Same<z.output<typeof walkStateSchema>, Walk> = true;
void _walkSchemaMatches;
