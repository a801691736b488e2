// The shop-patterns and vehicles API contract.
import { z } from 'zod';
import { caseStatusSchema } from './cases';

const day = (what: string) => z.iso.date({ error: `${what} must be a date YYYY-MM-DD.` });

/** Longest period the dashboard answers for, so a typo cannot ask for centuries of weeks. */
export const MAX_PERIOD_DAYS = 1100;

export const patternsQuerySchema = z
  .object({
    from: day('from').optional(),
    to: day('to').optional(),
    platformId: z.coerce.number({ error: 'platformId must be a number.' }).int().positive('platformId must be a positive number.').max(Number.MAX_SAFE_INTEGER).optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'from must be on or before to.', path: ['from'] });
export type PatternsQuery = z.infer<typeof patternsQuerySchema>;

export const csvTables = ['topCodes', 'topSymptoms', 'comebacks', 'byPlatform', 'byRootCause'] as const;
export type CsvTable = (typeof csvTables)[number];

export const patternsCsvQuerySchema = z
  .object({
    table: z.enum(csvTables, { error: `table must be one of ${csvTables.join(', ')}.` }),
    from: day('from').optional(),
    to: day('to').optional(),
    platformId: z.coerce.number({ error: 'platformId must be a number.' }).int().positive().max(Number.MAX_SAFE_INTEGER).optional(),
  })
  .refine((q) => !q.from || !q.to || q.from <= q.to, { message: 'from must be on or before to.', path: ['from'] });

const rateSchema = z.number().min(0).max(1).nullable();
const platformLabel = z.string();

export const comebackRowSchema = z.object({
  vehicle: z.object({ id: z.number(), vin: z.string(), plate: z.string().nullable() }),
  code: z.string().nullable(),
  firstCaseId: z.number(),
  repeatCaseId: z.number(),
  firstTitle: z.string(),
  repeatTitle: z.string(),
  repeatDay: z.string(),
  days: z.number(),
  km: z.number().nullable(),
  reason: z.string(),
});
export type ComebackRowView = z.infer<typeof comebackRowSchema>;

export const patternsResponseSchema = z.object({
  period: z.object({ from: z.string(), to: z.string(), platformId: z.number().nullable(), defaulted: z.boolean() }),
  window: z.object({ days: z.number(), km: z.number() }),
  totals: z.object({ cases: z.number(), confirmed: z.number(), comebacks: z.number() }),
  topCodes: z.array(z.object({ code: z.string(), title: z.string(), count: z.number() })),
  topSymptoms: z.array(z.object({ tag: z.string(), count: z.number() })),
  comebacks: z.array(comebackRowSchema),
  comebackRate: rateSchema,
  confirmedRate: rateSchema,
  medianDaysToConfirm: z.number().nullable(),
  byPlatform: z.array(
    z.object({ platformId: z.number().nullable(), label: platformLabel, cases: z.number(), comebacks: z.number(), comebackRate: rateSchema, confirmedRate: rateSchema }),
  ),
  byRootCause: z.array(z.object({ key: z.string(), label: z.string(), fixes: z.number(), cameBack: z.number(), comebackRate: rateSchema })),
  trend: z.array(z.object({ week: z.string(), cases: z.number(), comebacks: z.number() })),
  repeatPatterns: z.array(
    z.object({
      platformId: z.number(),
      platform: platformLabel,
      causeKey: z.string(),
      causeLabel: z.string(),
      vehicles: z.number(),
      cases: z.array(z.object({ id: z.number(), title: z.string(), vin: z.string().nullable(), day: z.string() })),
    }),
  ),
  waitingForReview: z.array(z.object({ id: z.number(), title: z.string(), author: z.string(), submittedAt: z.string() })),
  platforms: z.array(z.object({ id: z.number(), label: platformLabel })),
});
export type PatternsResponse = z.infer<typeof patternsResponseSchema>;

export const digestSentSchema = z.object({ sent: z.number() });

// ---- vehicles ----

export { idParamsSchema as vehicleIdParamsSchema } from './auth';

export const vehicleSummarySchema = z.object({
  id: z.number(),
  vin: z.string(),
  plate: z.string().nullable(),
  fleetNumber: z.string().nullable(),
  platform: z.object({ id: z.number(), label: z.string() }).nullable(),
  visits: z.number(),
  lastVisit: z.string().nullable(),
  comebacks: z.number(),
});
export type VehicleSummary = z.infer<typeof vehicleSummarySchema>;
export const vehicleListSchema = z.object({ vehicles: z.array(vehicleSummarySchema) });

export const vehicleVisitSchema = z.object({
  caseId: z.number(),
  title: z.string(),
  day: z.string(),
  mileage: z.number().nullable(),
  mileageUnit: z.enum(['km', 'mi']).nullable(),
  codes: z.array(z.string()),
  status: caseStatusSchema,
  confirmed: z.boolean(),
  comebackOf: z.object({ caseId: z.number(), days: z.number(), reason: z.string() }).nullable(),
  cameBackAs: z.array(z.object({ caseId: z.number(), days: z.number(), reason: z.string() })),
});
export type VehicleVisit = z.infer<typeof vehicleVisitSchema>;
export const vehicleDetailSchema = z.object({ vehicle: vehicleSummarySchema, visits: z.array(vehicleVisitSchema), window: z.object({ days: z.number(), km: z.number() }) });
