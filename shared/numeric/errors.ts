// Named errors of the numeric core. Each names the key or field at fault so that the CLI, the
// server and the forms can show one line the user can act on.

/** A model configuration that cannot describe a core; `key` is the configuration key at fault. */
export class ModelConfigError extends Error {
  constructor(
    readonly key: string,
    message: string,
  ) {
    super(`${key}: ${message}`);
    this.name = 'ModelConfigError';
  }
}

/** An angle code that the angle format cannot hold. */
export class AngleCodeError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'AngleCodeError';
  }
}

/** An output code or value that the output format cannot hold. */
export class OutputCodeError extends RangeError {
  constructor(message: string) {
    super(message);
    this.name = 'OutputCodeError';
  }
}

/** A plan that cannot produce codes (bad field, or too many codes to hold at once). */
export class PlanError extends Error {
  constructor(
    readonly key: string,
    message: string,
  ) {
    super(`${key}: ${message}`);
    this.name = 'PlanError';
  }
}

/** Scoring inputs or accumulators that do not fit together. */
export class ScoringError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ScoringError';
  }
}
