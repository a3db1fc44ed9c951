import { HttpException, HttpStatus, Injectable, type CallHandler, type ExecutionContext, type NestInterceptor } from '@nestjs/common';
import type { Response } from 'express';
import { catchError, throwError, type Observable } from 'rxjs';

// A refusal that says how long to wait, and the interceptor that turns it into a Retry-After header: no
// table and nothing of auth in it, shared by the sign-in (auth) and sign-off (reviews) routes.

/** 429 that knows how long to wait; RetryAfterInterceptor puts that in the Retry-After header. */
export class TooManyAttemptsException extends HttpException {
  constructor(
    readonly retryAfterSeconds: number,
    message: string,
  ) {
    super({ statusCode: 429, message, error: 'Too Many Requests', retryAfter: retryAfterSeconds }, HttpStatus.TOO_MANY_REQUESTS);
  }
}

/** Sets Retry-After on the answer when the handler refused with TooManyAttemptsException. */
@Injectable()
export class RetryAfterInterceptor implements NestInterceptor {
  intercept(context: ExecutionContext, next: CallHandler): Observable<unknown> {
    return next.handle().pipe(
      catchError((error: unknown) => {
        if (error instanceof TooManyAttemptsException) {
          context.switchToHttp().getResponse<Response>().setHeader('Retry-After', String(error.retryAfterSeconds));
        }
        return throwError(() => error);
      }),
    );
  }
}
