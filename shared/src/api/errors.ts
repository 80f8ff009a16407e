/** Every error code the API answers with, and the HTTP status it travels with. */
export const ERROR_STATUS = {
  bad_request: 400,
  validation_failed: 400,
  unauthenticated: 401,
  forbidden: 403,
  csrf_failed: 403,
  not_found: 404,
  conflict: 409,
  stale_version: 409,
  payload_too_large: 413,
  unsupported_media_type: 415,
  invalid_input: 422,
  stage_rule_failed: 422,
  rate_limited: 429,
  internal: 500,
} as const;

export type ErrorCode = keyof typeof ERROR_STATUS;

/** The one error body every API failure has. */
export interface ApiErrorBody {
  error: { code: ErrorCode; message: string; details?: unknown };
}
