/** A computation refused its input; the API turns it into 422 with `message` shown to the person. */
export class InvalidInputError extends Error {
  readonly code = 'invalid_input';
  constructor(
    message: string,
    /** Name of the offending input field, when there is one. */
    readonly field?: string,
  ) {
    super(message);
    this.name = 'InvalidInputError';
  }
}
