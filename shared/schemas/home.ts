// GET /api/home: what waits for the signed-in person, per role. Every list is capped
// (HOME_LIST_LIMIT) and carries its total, so the answer never grows with the shop.
import { z } from 'zod';
import { comebackRowSchema } from './patterns';

export const HOME_LIST_LIMIT = 5;

const listOf = <T extends z.ZodType>(item: T) => z.object({ total: z.number().int().min(0), items: z.array(item) });

export const homeWalkSchema = z.object({
  id: z.number(),
  treeTitle: z.string(),
  platform: z.string().nullable(),
  codes: z.array(z.string()),
  nextStep: z.string().nullable(),
  updatedAt: z.string(),
});

export const homeCaseSchema = z.object({ id: z.number(), title: z.string(), updatedAt: z.string() });

export const homeReturnedSchema = homeCaseSchema.extend({ returnedBy: z.string(), comment: z.string() });

export const homeReviewSchema = z.object({ id: z.number(), title: z.string(), author: z.string(), submittedAt: z.string() });

export const homeDigestSchema = z.object({
  lastSentAt: z.string().nullable(),
  lastKind: z.enum(['scheduled', 'manual']).nullable(),
  recipients: z.number().nullable(),
  nextRunAt: z.string().nullable(),
});

export const homeResponseSchema = z.object({
  openWalks: listOf(homeWalkSchema),
  drafts: listOf(homeCaseSchema),
  returned: listOf(homeReturnedSchema),
  /** Seniors and managers: cases waiting for review, oldest submission first. */
  review: listOf(homeReviewSchema).nullable(),
  /** Managers: comebacks whose repeat visit falls in the last seven days. */
  comebacks: listOf(comebackRowSchema).extend({ from: z.string(), to: z.string() }).nullable(),
  digest: homeDigestSchema.nullable(),
});
export type HomeResponse = z.infer<typeof homeResponseSchema>;
