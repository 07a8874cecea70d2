/** An expected failure of the command line: printed as one line on stderr, no stack trace. */
export class CliError extends Error {
  constructor(
    message: string,
    /** 2 for bad input or usage, 1 for a failure while working. */
    readonly exitCode: 1 | 2 = 2,
  ) {
    super(message);
    this.name = 'CliError';
  }
}
