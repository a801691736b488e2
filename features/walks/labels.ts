import type { ColourName } from '../theme/tokens';
import type { WalkStep } from '../../shared/schemas/walks';
import type { System } from '../../shared/walk';
import type { IconName } from '../ui/icon';

export const SYSTEM_LABELS: Record<System, string> = {
  fuel: 'Fuel', ignition: 'Ignition', induction: 'Air and induction', mechanical: 'Mechanical', electrical: 'Electrical',
  network: 'Network', sensors: 'Sensors', exhaust: 'Exhaust', emissions: 'Emissions', cooling: 'Cooling', charging: 'Charging',
  software: 'Software', drivetrain: 'Drivetrain', hydraulics: 'Hydraulics', brakes: 'Brakes', steering: 'Steering', chassis: 'Chassis',
};

/** A step's state as word + symbol + tone, so it never rests on colour alone. */
export function stepStatus(step: Pick<WalkStep, 'state' | 'outcome'>): { label: string; symbol: IconName; tone: ColourName } {
  if (step.state === 'ruled_out') return { label: 'Ruled out', symbol: 'ruledOut', tone: 'slate' };
  if (step.state === 'tested' && step.outcome === 'fault_found') return { label: 'Fault found', symbol: 'found', tone: 'moss' };
  if (step.state === 'tested') return { label: 'Tested, no fault', symbol: 'check', tone: 'slate' };
  return { label: 'Open', symbol: 'open', tone: 'tide' };
}

export const percent = (p: number) => (p > 0 && p < 0.005 ? '<1%' : `${Math.round(p * 100)}%`);
export const minutes = (m: number) => `${m < 10 ? m.toFixed(1).replace(/\.0$/, '') : Math.round(m)} min`;

/** Tree cautions start with "Caution:" and end by deferring; the Caution component already says both. */

/** 'after-timing-work' -> 'after timing work'. */
export const tagWords = (tag: string) => tag.replace(/-/g, ' ');

export { shortDate } from '../shell/shop-clock';
