// The case-notes API contract: what clients send and what the server answers.
import { z } from 'zod';
import { parseDtc } from '../codes';
import { caseStatuses } from '../roles';
import { checkVin } from '../vin';

export const caseStatusSchema = z.enum(caseStatuses, { error: 'Status must be draft, review or published.' });

/** A trouble code in any common spelling, stored in its normal form ('p0302-13' -> 'P0302-13'). */
export const dtcInputSchema = z.string({ error: 'A trouble code must be text.' }).transform((value, ctx) => {
  const parsed = parseDtc(value);
  if (!parsed.ok) {
    ctx.addIssue({ code: 'custom', message: `"${value.slice(0, 20)}" is not a trouble code: ${parsed.reason}.` });
    return z.NEVER;
  }
  return parsed.dtc.full;
});

/** Symptom and context tags are kebab-case words: "Rough idle" -> "rough-idle". */
export const tagSchema = z
  .string({ error: 'A tag must be text.' })
  .trim()
  .toLowerCase()
  .transform((s) => s.replace(/[\s_]+/g, '-').replace(/[^a-z0-9-]/g, '').replace(/-+/g, '-').replace(/^-|-$/g, ''))
  .pipe(z.string().min(2, 'A tag needs at least 2 letters.').max(60, 'A tag is at most 60 characters.'));

const unique = <T>(list: T[]) => [...new Set(list)];

export const vinInputSchema = z
  .string()
  .trim()
  .toUpperCase()
  .superRefine((vin, ctx) => {
    const check = checkVin(vin);
    if (!check.valid) ctx.addIssue({ code: 'custom', message: check.errors[0] ?? 'That VIN is not valid.' });
  });

export const vehicleInputSchema = z.strictObject({
  vin: vinInputSchema.optional(),
  plate: z.string().trim().max(20, 'A plate is at most 20 characters.').optional(),
  fleetNumber: z.string().trim().max(30).optional(),
  mileage: z.number({ error: 'Mileage must be a number.' }).int('Mileage is a whole number.').min(0).max(2_000_000).optional(),
  mileageUnit: z.enum(['km', 'mi']).optional(),
  visitDate: z.iso.date({ error: 'Visit date must be YYYY-MM-DD.' }).optional(),
});

const text = (max: number, what: string) => z.string({ error: `${what} must be text.` }).trim().max(max, `${what} is at most ${max} characters.`);

const caseFields = {
  title: text(200, 'The title').min(3, 'Give the case a title of at least 3 characters.'),
  body: z.string({ error: 'The note must be text.' }).max(200_000, 'The note is at most 200,000 characters.'),
  platformId: z.number({ error: 'platformId must be a number.' }).int().positive().nullable().optional(),
  vehicle: vehicleInputSchema.nullable().optional(),
  codes: z.array(dtcInputSchema, { error: 'codes must be a list of trouble codes.' }).max(40, 'At most 40 codes.').transform(unique),
  symptoms: z.array(tagSchema, { error: 'symptoms must be a list of tags.' }).max(30, 'At most 30 symptom tags.').transform(unique),
  context: z.array(tagSchema).max(10).transform(unique).optional(),
  rootCause: text(2000, 'The root cause').nullable().optional(),
  fix: text(2000, 'The fix').nullable().optional(),
  cause: z.string().regex(/^[a-z0-9-]+\/[a-z0-9-]+$/, 'cause is a cause-tree id like misfire/coil.').nullable().optional(),
};

export const caseCreateSchema = z.strictObject({
  ...caseFields,
  codes: caseFields.codes.default([]),
  symptoms: caseFields.symptoms.default([]),
  status: caseStatusSchema.optional(),
});
export type CaseCreate = z.infer<typeof caseCreateSchema>;

export const casePatchSchema = z.strictObject({
  title: caseFields.title.optional(),
  body: caseFields.body.optional(),
  platformId: caseFields.platformId,
  vehicle: caseFields.vehicle,
  codes: caseFields.codes.optional(),
  symptoms: caseFields.symptoms.optional(),
  context: caseFields.context,
  rootCause: caseFields.rootCause,
  fix: caseFields.fix,
  cause: caseFields.cause,
  version: z.number({ error: 'Send the version you edited (a number).' }).int().positive(),
});
export type CasePatch = z.infer<typeof casePatchSchema>;

export const returnSchema = z.strictObject({ comment: text(2000, 'The comment').min(3, 'Say what needs changing (at least 3 characters).') });
/** Without `cause`, a case with no cause linked gets the best suggestion when it is clearly ahead. */
export const confirmSchema = z.strictObject({ note: text(2000, 'The note').optional(), cause: caseFields.cause.unwrap().unwrap().optional() });
export const commentSchema = z.strictObject({ body: text(2000, 'The comment').min(1, 'Write a comment.') });

const sortKeys = ['updated', 'platform', 'codes', 'status', 'confirmed', 'title'] as const;
export const caseListQuerySchema = z.object({
  status: caseStatusSchema.optional(),
  platformId: z.coerce.number().int().positive().optional(),
  vehicleId: z.coerce.number().int().positive().optional(),
  code: dtcInputSchema.optional(),
  tag: tagSchema.optional(),
  confirmed: z.enum(['yes', 'no']).optional(),
  mine: z.enum(['1', '0']).optional(),
  sort: z.enum(sortKeys).default('updated'),
  dir: z.enum(['asc', 'desc']).default('desc'),
  page: z.coerce.number().int().min(1).max(100_000).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type CaseListQuery = z.infer<typeof caseListQuerySchema>;

// ---- responses ----

const personSchema = z.object({ id: z.number(), name: z.string() });
export const platformRefSchema = z.object({ id: z.number(), make: z.string(), model: z.string(), engine: z.string() });

export const caseSummarySchema = z.object({
  id: z.number(),
  title: z.string(),
  status: caseStatusSchema,
  codes: z.array(z.string()),
  symptoms: z.array(z.string()),
  platform: platformRefSchema.nullable(),
  vehicle: z
    .object({
      id: z.number(),
      vin: z.string(),
      plate: z.string().nullable(),
      /** North American rules this VIN does not follow (never a refusal: see shared/vin.ts) */
      vinWarnings: z.array(z.string()).default([]),
    })
    .nullable(),
  author: personSchema,
  fixConfirmed: z.boolean(),
  updatedAt: z.string(),
  visitDate: z.string().nullable(),
});
export type CaseSummary = z.infer<typeof caseSummarySchema>;

export const caseListResponseSchema = z.object({
  cases: z.array(caseSummarySchema),
  total: z.number(),
  page: z.number(),
  pageSize: z.number(),
});

export const attachmentSchema = z.object({ id: z.number(), name: z.string(), size: z.number(), mime: z.string(), url: z.string(), createdAt: z.string() });
export type Attachment = z.infer<typeof attachmentSchema>;

export const caseCommentSchema = z.object({
  id: z.number(),
  kind: z.enum(['comment', 'returned', 'submitted', 'published', 'confirmed']),
  body: z.string(),
  author: personSchema,
  createdAt: z.string(),
});

export const measurementSchema = z.object({ value: z.number(), unit: z.string(), raw: z.string() });

export const noteExtractSchema = z.object({
  codes: z.array(z.string()),
  suggestedCodes: z.array(z.string()),
  measurements: z.array(measurementSchema),
  headings: z.array(z.object({ depth: z.number(), text: z.string() })),
  /** Set when the note nests deeper than shared/markdown/nesting.ts keeps: what was cut. */
  markdownNotice: z.string().nullable(),
});
export type NoteExtract = z.infer<typeof noteExtractSchema>;

export const repeatVisitSchema = z.object({
  caseId: z.number(),
  title: z.string(),
  relation: z.enum(['comeback-of', 'came-back-as']),
  days: z.number(),
  reason: z.string(),
});

export const causeSuggestionSchema = z.object({
  cause: z.string(),
  title: z.string(),
  treeId: z.string(),
  treeTitle: z.string(),
  system: z.string(),
  score: z.number(),
});
export type CauseSuggestionView = z.infer<typeof causeSuggestionSchema>;

/** Every cause of the shop's trees, for the editor's cause picker (grouped there by tree and system). */
export const causeOptionSchema = causeSuggestionSchema.omit({ score: true });
export const causeListSchema = z.object({ causes: z.array(causeOptionSchema) });
export type CauseOption = z.infer<typeof causeOptionSchema>;

/** What the editor sends to have its unsaved write-up read for causes. */
export const causeSuggestRequestSchema = z.strictObject({
  title: z.string().max(200).optional(),
  rootCause: z.string().max(2000).nullable().optional(),
  fix: z.string().max(2000).nullable().optional(),
  platformId: caseFields.platformId,
  codes: caseFields.codes.default([]),
  symptoms: z.array(z.string().max(60)).max(30).default([]),
  context: z.array(z.string().max(60)).max(10).default([]),
});
export const causeSuggestResponseSchema = z.object({ suggestions: z.array(causeSuggestionSchema) });

export const caseDetailSchema = caseSummarySchema.extend({
  body: z.string(),
  context: z.array(z.string()),
  rootCause: z.string().nullable(),
  fix: z.string().nullable(),
  cause: z.string().nullable(),
  /** The linked cause's title in the shop's trees. */
  causeTitle: z.string().nullable(),
  /** Whether the cause was set by a person or linked from the best suggestion when the fix was confirmed. */
  causeLinkedBy: z.enum(['author', 'suggestion']).nullable(),
  /** Tree causes the write-up most likely describes (root cause, fix, title, codes, symptoms), best first. */
  causeSuggestions: z.array(causeSuggestionSchema),
  vehicle: z
    .object({ id: z.number(), vin: z.string(), plate: z.string().nullable(), mileage: z.number().nullable(), mileageUnit: z.enum(['km', 'mi']).nullable() })
    .nullable(),
  confirmation: z.object({ by: personSchema, at: z.string(), note: z.string().nullable() }).nullable(),
  version: z.number(),
  createdAt: z.string(),
  attachments: z.array(attachmentSchema),
  comments: z.array(caseCommentSchema),
  extracted: noteExtractSchema,
  /** The same as extracted.markdownNotice, at the top so every reader of a case sees it. */
  markdownNotice: z.string().nullable(),
  repeats: z.array(repeatVisitSchema),
  permissions: z.object({ edit: z.boolean(), submit: z.boolean(), publish: z.boolean(), return: z.boolean(), confirm: z.boolean(), delete: z.boolean() }),
});
export type CaseDetail = z.infer<typeof caseDetailSchema>;
export const caseResponseSchema = z.object({ case: caseDetailSchema });

export const revisionListSchema = z.object({
  revisions: z.array(z.object({ version: z.number(), title: z.string(), author: personSchema, createdAt: z.string() })),
});
export const revisionDiffSchema = z.object({
  from: z.number(),
  to: z.number(),
  fields: z.array(z.object({ field: z.string(), before: z.string(), after: z.string() })),
  body: z.array(z.object({ kind: z.enum(['same', 'added', 'removed']), text: z.string() })),
});

export const tagsResponseSchema = z.object({ tags: z.array(z.object({ tag: z.string(), count: z.number() })) });

export const ATTACHMENT_MAX_BYTES = 15 * 1024 * 1024;
export const ATTACHMENT_TYPES = ['image/jpeg', 'image/png', 'image/webp', 'application/pdf', 'text/csv', 'text/plain'] as const;
