// The drive-cycle guide (content/readiness/drive-cycles.yaml): what lets each monitor run.
import { z } from 'zod';
import { composeCaution } from '../walk/cautions';
import { monitorDef, monitorKeys, type MonitorState } from './monitors';

export const driveCycleGuideSchema = z.strictObject({
  note: z.string().min(1),
  roadTestCaution: z.string().regex(/manufacturer/i, 'the road-test caution must defer to the manufacturer'),
  monitors: z
    .record(z.string(), z.strictObject({ conditions: z.array(z.string().min(1)).min(1, 'list at least one condition'), caution: z.string().optional() }))
    .superRefine((monitors, check) => {
      for (const key of Object.keys(monitors).filter((k) => !monitorKeys.includes(k))) {
        check.addIssue({ code: 'custom', path: [key], message: `"${key}" is not a monitor key (see shared/readiness/monitors.ts)` });
      }
    }),
});
export type DriveCycleGuide = z.infer<typeof driveCycleGuideSchema>;

export interface DriveCycleStep {
  monitor: string;
  name: string;
  conditions: string[];
  caution: string;
}

/** Steps for the incomplete monitors the guide knows, in the order given; the road-test caution on each, deferring once. */
export function nextSteps(incomplete: readonly Pick<MonitorState, 'key'>[], guide: DriveCycleGuide): DriveCycleStep[] {
  return incomplete.flatMap(({ key }) => {
    const entry = guide.monitors[key];
    if (!entry) return [];
    const caution = composeCaution([entry.caution, guide.roadTestCaution])!;
    return [{ monitor: key, name: monitorDef(key)?.name ?? key, conditions: entry.conditions, caution }];
  });
}
