// The platform API contract. The field and cross-field rules are shared/platform.ts;
// this adds the database's column limits and the patch form.
import { z } from 'zod';
import { fuels, inductions, platformFieldsSchema, platformLayouts, platformProblems } from '../platform';

// db/schema.ts: model varchar(60), engine varchar(30).
const COLUMN_LIMITS = { model: 60, engine: 30 } as const;

function columnProblems(p: { model?: string; engine?: string }): [string[], string][] {
  const out: [string[], string][] = [];
  if ((p.model?.length ?? 0) > COLUMN_LIMITS.model) out.push([['model'], `Model is at most ${COLUMN_LIMITS.model} characters`]);
  if ((p.engine?.length ?? 0) > COLUMN_LIMITS.engine) out.push([['engine'], `Engine is at most ${COLUMN_LIMITS.engine} characters`]);
  return out;
}

/** A whole platform record: the shared field rules, cross-field rules and column limits. */
export const platformCreateSchema = z.strictObject(platformFieldsSchema.shape).superRefine((p, ctx) => {
  for (const [path, message] of [...columnProblems(p), ...platformProblems(p)]) ctx.addIssue({ code: 'custom', path, message });
});

const f = platformFieldsSchema.shape;

/** A patch: any field; null clears an optional one. The merged record is checked with platformCreateSchema. */
export const platformPatchSchema = z
  .strictObject({
    ...platformFieldsSchema.partial().shape,
    banks: f.banks.nullable(),
    firingOrder: f.firingOrder.nullable(),
    fuel: f.fuel.nullable(),
    induction: f.induction.nullable(),
  })
  .refine((p) => Object.keys(p).length > 0, 'Send at least one field to change.');
export type PlatformPatch = z.infer<typeof platformPatchSchema>;

// ---- responses ----

export const platformViewSchema = z.object({
  id: z.number(),
  make: z.string(),
  model: z.string(),
  engine: z.string(),
  yearFrom: z.number(),
  yearTo: z.number(),
  cylinders: z.number(),
  layout: z.enum(platformLayouts),
  banks: z.object({ '1': z.array(z.number()), '2': z.array(z.number()) }).optional(),
  firingOrder: z.array(z.number()).optional(),
  fuel: z.enum(fuels).optional(),
  induction: z.enum(inductions).optional(),
});
export type PlatformView = z.infer<typeof platformViewSchema>;

export const platformListResponseSchema = z.object({ platforms: z.array(platformViewSchema) });

export const platformFactsSchema = z.object({
  /** cylinders on each bank; an inline engine has them all on bank 1 */
  banks: z.object({ '1': z.array(z.number()), '2': z.array(z.number()) }).nullable(),
  /** pairs 360 crank degrees apart in the firing order */
  companionPairs: z.array(z.tuple([z.number(), z.number()])),
  /** each companion pair in plain words, e.g. 'cylinders 1 and 6: one on each bank, firing companions' */
  companionWords: z.array(z.string()),
  /** one sentence per bank, e.g. 'Bank 1: cylinders 1, 3 and 5' */
  bankWords: z.array(z.string()),
});

export const platformDetailResponseSchema = z.object({ platform: platformViewSchema, facts: platformFactsSchema });
export type PlatformDetailResponse = z.infer<typeof platformDetailResponseSchema>;

export const platformCreatedSchema = z.object({ id: z.number() });
