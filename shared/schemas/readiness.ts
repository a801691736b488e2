// The readiness API contract: decode, the shop's rule, case snapshots.
import { z } from 'zod';
import { ignitionTypes } from '../readiness/monitors';
import { readinessRuleIds } from '../readiness/verdict';

// ---- requests ----

const BYTES_HINT = 'Give the PID $01 answer in hex, e.g. bytes=41 01 00 07 65 00.';

const bytesField = z.string({ error: BYTES_HINT }).trim().min(1, BYTES_HINT).max(2000, 'At most 2000 characters of hex (several control units) at a time.');

const modelYearField = z.coerce
  .number({ error: 'modelYear must be a year, e.g. 2012.' })
  .int('modelYear must be a whole year.')
  .min(1980, 'modelYear must be 1980 or later.')
  .max(2100, 'modelYear must be 2100 or earlier.');

export const readinessDecodeQuerySchema = z.object({
  bytes: bytesField,
  modelYear: modelYearField.optional(),
});

export const readinessRuleBodySchema = z.strictObject({
  rule: z.enum(readinessRuleIds, { error: `rule must be one of ${readinessRuleIds.join(', ')}.` }),
});

export const snapshotCreateSchema = z
  .strictObject({
    label: z.string({ error: 'Give the snapshot a label, e.g. "Before drive cycle".' }).trim().min(1, 'Give the snapshot a label, e.g. "Before drive cycle".').max(80, 'A label is at most 80 characters.'),
    bytes: bytesField.optional(),
    text: z.string().max(64 * 1024, 'Paste at most 64 KB of the printout: the monitor part is enough.').optional(),
    modelYear: modelYearField.optional(),
  })
  .refine((s) => (s.bytes === undefined) !== (s.text === undefined), { message: 'Send either bytes (the PID $01 answer) or text (a printed monitor table), not both.', path: ['bytes'] });
export type SnapshotCreate = z.infer<typeof snapshotCreateSchema>;

// ---- responses ----

export const monitorStateSchema = z.object({
  key: z.string(),
  name: z.string(),
  kind: z.enum(['continuous', 'non-continuous']),
  supported: z.boolean(),
  complete: z.boolean(),
});

export const ruleSummarySchema = z.object({ id: z.string(), name: z.string(), summary: z.string(), source: z.string() });

export const driveCycleStepSchema = z.object({
  monitor: z.string(),
  name: z.string(),
  conditions: z.array(z.string()),
  caution: z.string(),
});

export const readinessSchema = z.object({
  mil: z.boolean().nullable(),
  confirmedCodes: z.number().nullable(),
  ignition: z.enum(ignitionTypes),
  monitors: z.array(monitorStateSchema),
  incomplete: z.array(monitorStateSchema.pick({ key: true, name: true, kind: true })),
  verdict: z.object({
    rule: ruleSummarySchema,
    ready: z.boolean(),
    reasons: z.array(z.string()),
    maxIncomplete: z.number().nullable(),
    modelYear: z.number().nullable(),
    note: z.string(),
  }),
  /** how to get each incomplete monitor to run (content/readiness) */
  nextSteps: z.array(driveCycleStepSchema),
});
export type ReadinessView = z.infer<typeof readinessSchema>;

export const readinessRulesResponseSchema = z.object({
  rules: z.array(ruleSummarySchema),
  current: z.string(),
  note: z.string(),
});

export const snapshotSchema = z.object({
  id: z.number(),
  caseId: z.number(),
  caseTitle: z.string(),
  label: z.string(),
  takenAt: z.string(),
  takenBy: z.string(),
  readiness: readinessSchema,
  /** against the snapshot before it on the same case */
  change: z.object({ finished: z.array(z.string()), stillIncomplete: z.array(z.string()), reset: z.array(z.string()) }).nullable(),
});
export type SnapshotView = z.infer<typeof snapshotSchema>;

export const snapshotListSchema = z.object({ snapshots: z.array(snapshotSchema) });
