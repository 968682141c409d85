// Errors in the processor's shape: HTTP status plus { error: { type, code, message, param } }.

export type ErrorType = 'invalid_request_error' | 'card_error' | 'api_error' | 'idempotency_error';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: ErrorType,
    message: string,
    readonly code?: string,
    readonly param?: string,
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }

  toJSON() {
    return {
      error: {
        type: this.type,
        ...(this.code ? { code: this.code } : {}),
        message: this.message,
        ...(this.param ? { param: this.param } : {}),
        ...this.extra,
      },
    };
  }
}

export const noSuch = (kind: string, id: string, param = 'id') =>
  new ApiError(404, 'invalid_request_error', `No such ${kind}: '${id}'`, 'resource_missing', param);

export const missing = (param: string) =>
  new ApiError(400, 'invalid_request_error', `Missing required param: ${param}.`, 'parameter_missing', param);

export const invalid = (param: string, message: string, code = 'parameter_invalid_empty') =>
  new ApiError(400, 'invalid_request_error', message, code, param);
