import type { ErrorRequestHandler } from 'express';
import { MulterError } from 'multer';
import { LIMITS } from '../../shared/limits';
import { ApiError } from './api-error';

/**
 * The one place errors become responses. Expected failures carry their status; body-parser and
 * upload errors become 400/413; anything else is a 500 with a plain message, logged here, and no
 * stack trace ever leaves the server.
 */
export function errorHandler(log: (line: string) => void): ErrorRequestHandler {
  return (error, request, response, _next) => {
    let apiError: ApiError;
    if (error instanceof ApiError) {
      apiError = error;
    } else if (error?.type === 'entity.too.large') {
      apiError = new ApiError(413, 'too_large', `Request body is larger than ${LIMITS.maxRequestBodyBytes} bytes`);
    } else if (error?.type === 'entity.parse.failed') {
      apiError = new ApiError(400, 'invalid', 'Request body is not valid JSON');
    } else if (error instanceof MulterError) {
      apiError =
        error.code === 'LIMIT_FILE_SIZE'
          ? new ApiError(413, 'too_large', `file must be at most ${LIMITS.maxPatchFileBytes} bytes`, 'file')
          : new ApiError(400, 'invalid', `${error.field ?? 'file'}: ${error.message}`, error.field ?? 'file');
    } else {
      log(`error: ${request.method} ${request.originalUrl}: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
      apiError = new ApiError(500, 'internal', 'Something went wrong on the server');
    }
    response.status(apiError.status).json(apiError.body());
  };
}
