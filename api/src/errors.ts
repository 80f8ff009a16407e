import { ERROR_STATUS, type ErrorCode } from '@midgray/shared';

/** The one error class of the API: a code from shared's list, a message for a person, optional details. */
export class AppError extends Error {
  readonly status: number;
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
    this.status = ERROR_STATUS[code];
  }
}

/** Throws a 404 with the usual wording; used for records outside the caller's channels too. */
export function notFound(what: string): never {
  throw new AppError('not_found', `${what} not found`);
}
