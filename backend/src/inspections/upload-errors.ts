import { type ArgumentsHost, Catch, type ExceptionFilter, PayloadTooLargeException } from '@nestjs/common';
import type { Request, Response } from 'express';
import { PHOTO_MAX_BYTES, type ApiErrorBody } from '@loambook/common';
import { DomainError } from '../common/domain-error';

/**
 * An upload refused for its size (413) or its content (415). A DomainError, so anything that catches
 * those sees a code and a message; the upload routes answer it with its own status through the filter
 * below (the app-wide filter knows no 413/415 kind).
 */
export class UploadRefusedError extends DomainError {
  constructor(
    readonly status: 413 | 415,
    code: 'UPLOAD.TOO_LARGE' | 'UPLOAD.UNSUPPORTED_TYPE',
    message: string,
  ) {
    super('invalid', code, message);
  }
}

const MB = PHOTO_MAX_BYTES / (1024 * 1024);

/**
 * On the upload routes: multer's "file too large" (which Nest turns into PayloadTooLargeException) and
 * UploadRefusedError, answered in the common error shape. Every other error goes on to the app's filter.
 */
@Catch(PayloadTooLargeException, UploadRefusedError)
export class UploadErrorsFilter implements ExceptionFilter {
  catch(exception: PayloadTooLargeException | UploadRefusedError, host: ArgumentsHost): void {
    const ctx = host.switchToHttp();
    const req = ctx.getRequest<Request & { id?: string }>();
    const res = ctx.getResponse<Response>();
    const [status, code, message] =
      exception instanceof UploadRefusedError
        ? [exception.status, exception.code, exception.message]
        : [413, 'UPLOAD.TOO_LARGE', `The file is larger than ${MB} MB. Send a smaller photo.`];
    res
      .status(status)
      .json({ code, message, details: null, requestId: String(req.id ?? '') } satisfies ApiErrorBody);
  }
}
