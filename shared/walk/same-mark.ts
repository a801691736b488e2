import type { Step, StepMark } from './walk';

/**
 * True when the step already shows this mark, so sending it again changes nothing.
 * A mark queued offline may be re-sent after its first answer was lost; the server
 * then returns the walk as it is instead of counting a second mark or refusing it.
 */
export function isSameMark(step: Step, mark: StepMark): boolean {
  if (step.state !== mark.state) return false;
  if (mark.state === 'open') return true;
  if ((step.outcome ?? null) !== (mark.outcome ?? null)) return false;
  const m = mark.measurement;
  const s = step.measurement;
  if ((m === undefined) !== (s === undefined)) return false;
  if (m && s && (m.value !== s.value || m.unit !== s.unit)) return false;
  return (step.note ?? '') === (mark.note?.trim() ?? '');
}
