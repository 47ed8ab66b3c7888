import { ArgumentsHost, Catch, HttpException, HttpStatus, Logger, type ExceptionFilter } from '@nestjs/common';
import type { Response } from 'express';
import type { ApiErrorBody } from '@stavemark/shared';
import { DomainError, ErrorCode } from './errors.js';

const STATUS_BY_CODE: Record<ErrorCode, number> = {
  [ErrorCode.NotFound]: HttpStatus.NOT_FOUND,
  [ErrorCode.Conflict]: HttpStatus.CONFLICT,
  [ErrorCode.Invalid]: HttpStatus.BAD_REQUEST,
  [ErrorCode.Forbidden]: HttpStatus.FORBIDDEN,
  [ErrorCode.Unauthenticated]: HttpStatus.UNAUTHORIZED,
  [ErrorCode.Immutable]: HttpStatus.CONFLICT,
};

const REASON: Record<number, string> = {
  400: 'Bad Request',
  401: 'Unauthorized',
  403: 'Forbidden',
  404: 'Not Found',
  409: 'Conflict',
  410: 'Gone',
  413: 'Payload Too Large',
  415: 'Unsupported Media Type',
  416: 'Range Not Satisfiable',
  429: 'Too Many Requests',
  500: 'Internal Server Error',
  503: 'Service Unavailable',
};

/** Every error leaves the server in one shape: { statusCode, error, message, details? }. */
@Catch()
export class AllExceptionsFilter implements ExceptionFilter {
  private readonly logger = new Logger('Errors');

  catch(exception: unknown, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    const body = this.toBody(exception);
    if (body.statusCode >= 500) this.logger.error(exception instanceof Error ? exception.stack : exception);
    res.status(body.statusCode).json(body);
  }

  private toBody(exception: unknown): ApiErrorBody {
    if (exception instanceof DomainError) {
      const statusCode = STATUS_BY_CODE[exception.code];
      return this.shape(statusCode, exception.message, exception.details);
    }
    if (exception instanceof HttpException) {
      const statusCode = exception.getStatus();
      const r = exception.getResponse();
      let message = exception.message;
      let details: ApiErrorBody['details'];
      if (typeof r === 'object' && r !== null) {
        const o = r as Record<string, unknown>;
        if (typeof o.message === 'string') message = o.message;
        else if (Array.isArray(o.message)) message = o.message.join('; ');
        if (o.details) details = o.details as ApiErrorBody['details'];
      }
      if (statusCode === 404 && message.startsWith('Cannot ')) message = 'No such route.';
      return this.shape(statusCode, message, details);
    }
    return this.shape(500, 'Something went wrong on our side. Nothing you entered was lost; please try again.');
  }

  private shape(statusCode: number, message: string, details?: ApiErrorBody['details']): ApiErrorBody {
    const body: ApiErrorBody = { statusCode, error: REASON[statusCode] ?? 'Error', message };
    if (details) body.details = details;
    return body;
  }
}
