// Errors thrown by the calculators and deadline rules. Each carries a stable code that the
// server maps to an HTTP status, and human messages that can be shown as they are.

export interface CalculatorIssue {
  /** The input field at fault, e.g. "spacingFt" or "points[2].elevationIn". */
  field: string;
  /** What is wrong, in words a user can act on. */
  message: string;
}

export class CalculatorInputError extends Error {
  readonly code = 'CALC.INVALID_INPUT';
  readonly details: CalculatorIssue[];

  constructor(details: CalculatorIssue[]) {
    super(
      details.length === 1 && details[0]
        ? `Invalid input: ${details[0].message}`
        : `Invalid input: ${details.length} problems (${details.map((d) => d.field).join(', ')})`,
    );
    this.name = 'CalculatorInputError';
    this.details = details;
  }
}

export class StatePackMissingError extends Error {
  readonly code = 'CALC.NO_STATE_PACK';
  readonly state: string;
  readonly details: CalculatorIssue[];

  /**
   * @param state two-letter code
   * @param topic what could not be computed, e.g. "the one-call notice before digging"
   * @param advice what the user must do instead
   */
  constructor(state: string, topic: string, advice?: string) {
    const message =
      `No rule pack exists for ${state} for ${topic}, so Loambook cannot compute it. ` +
      (advice ?? `Follow ${state}'s own law.`);
    super(message);
    this.name = 'StatePackMissingError';
    this.state = state;
    this.details = [{ field: 'state', message }];
  }
}
