// Named errors of the vectoring core beyond those shared with the rotation model
// (ModelConfigError, PlanError and ScoringError come from shared/numeric).

/** An x or y input code that the input format cannot hold. */
export class VectorInputError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'VectorInputError';
  }
}
