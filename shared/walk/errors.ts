export type WalkErrorCode =
  | 'unknown_step'
  | 'walk_finished'
  | 'outcome_required'
  | 'outcome_not_allowed'
  | 'measurement_not_allowed'
  | 'invalid_measurement'
  | 'reason_required'
  | 'wrong_unit';

/** A mark the walk cannot take. `code` is stable so the server can map it to a response. */
export class WalkError extends Error {
  override name = 'WalkError';
  constructor(
    readonly code: WalkErrorCode,
    message: string,
  ) {
    super(message);
  }
}

/** A cause tree that does not match the documented format (content/trees/README.md). */
export class TreeError extends Error {
  override name = 'TreeError';
  constructor(
    message: string,
    readonly problems: string[] = [],
  ) {
    super(message);
  }
}
