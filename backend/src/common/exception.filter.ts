import {
  type ArgumentsHost,
  Catch,
  type ExceptionFilter,
  HttpException,
  HttpStatus,
  Logger,
} from '@nestjs/common';
import { ForbiddenError } from '@casl/ability';
import type { NextFunction, Request, Response } from 'express';
import type { ApiErrorBody } from '@loambook/common';
import { DomainError, type DomainErrorKind } from './domain-error';

const STATUS: Record<DomainErrorKind, number> = {
  not_found: 404,
  conflict: 409,
  rule: 422,
  forbidden: 403,
  invalid: 400,
  unauthorized: 401,
  gone: 410,
};

const CODE_FOR_STATUS: Record<number, [string, string]> = {
  400: ['REQUEST.INVALID', 'The request could not be read.'],
  401: ['AUTH.REQUIRED', 'Please sign in.'],
  403: ['AUTH.FORBIDDEN', 'Your role does not allow this.'],
  404: ['ROUTE.NOT_FOUND', 'Nothing here.'],
  405: ['ROUTE.METHOD_NOT_ALLOWED', 'That method is not allowed here.'],
  413: ['REQUEST.TOO_LARGE', 'The request is too large.'],
  415: ['REQUEST.UNSUPPORTED_TYPE', 'Send JSON.'],
  429: ['AUTH.TOO_MANY_ATTEMPTS', 'Too many attempts. Wait a few minutes and try again.'],
};

/** One error shape for every failure: {code, message, details, requestId}. No stack reaches a client. */
@Catch()
export class AllExceptionsFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');

  catch(exception: unknown, host: ArgumentsHost): void {
    const ctx = host.switchToHttp();
    const req = ctx.getRequest<Request & { id?: string }>();
    const res = ctx.getResponse<Response>();
    const requestId = String(req.id ?? res.getHeader('x-request-id') ?? '');
    const [status, body] = this.describe(exception);
    if (status >= 500) {
      this.logger.error({ err: exception, requestId }, 'Unhandled error');
    }
    res.status(status).json({ ...body, requestId } satisfies ApiErrorBody);
  }

  private describe(e: unknown): [number, Omit<ApiErrorBody, 'requestId'>] {
    if (e instanceof DomainError) {
      return [STATUS[e.kind], { code: e.code, message: e.message, details: e.details }];
    }
    if (e instanceof ForbiddenError) {
      return [403, { code: 'AUTH.FORBIDDEN', message: 'Your role does not allow this.', details: null }];
    }
    if (e instanceof HttpException) {
      const status = e.getStatus();
      const [code, message] = CODE_FOR_STATUS[status] ?? [`HTTP.${status}`, e.message];
      return [status, { code, message, details: null }];
    }
    return [
      HttpStatus.INTERNAL_SERVER_ERROR,
      {
        code: 'INTERNAL',
        message: 'Something went wrong on our side. Quote the request id if you call.',
        details: null,
      },
    ];
  }
}

/**
 * Express error middleware for body-parser failures, which happen before Nest sees the request:
 * answers them in the same shape as everything else.
 */
export function bodyParserErrors(
  err: unknown,
  req: Request & { id?: string },
  res: Response,
  next: NextFunction,
) {
  const raw = err as { status?: number; type?: string };
  if (typeof raw?.status !== 'number' || typeof raw.type !== 'string') return next(err);
  const [code, message] =
    raw.type === 'entity.parse.failed'
      ? ['REQUEST.MALFORMED_JSON', 'The request body is not valid JSON.']
      : (CODE_FOR_STATUS[raw.status] ?? ['REQUEST.INVALID', 'The request could not be read.']);
  res
    .status(raw.status)
    .json({ code, message, details: null, requestId: String(req.id ?? '') } satisfies ApiErrorBody);
}
