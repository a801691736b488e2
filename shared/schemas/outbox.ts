import { z } from 'zod';

export const outboxResponseSchema = z.object({
  catcherDown: z.boolean().optional(),
  notice: z.string().optional(),
  messages: z.array(z.object({ id: z.string(), subject: z.string(), to: z.array(z.string()), date: z.string().nullable(), text: z.string() })),
});
export type OutboxMessage = z.infer<typeof outboxResponseSchema>['messages'][number];
