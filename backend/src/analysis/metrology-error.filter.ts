import { Catch, HttpStatus, type ArgumentsHost, type ExceptionFilter } from '@nestjs/common';
import type { Response } from 'express';
import { MetrologyError } from '@kilocycle/common/math';

/** The readings cannot support the computation (too few points, no settling…): 422 with common's message. */
@Catch(MetrologyError)
export class MetrologyErrorFilter implements ExceptionFilter {
  catch(error: MetrologyError, host: ArgumentsHost): void {
    host
      .switchToHttp()
      .getResponse<Response>()
      .status(HttpStatus.UNPROCESSABLE_ENTITY)
      .json({ statusCode: HttpStatus.UNPROCESSABLE_ENTITY, message: error.message, error: 'Unprocessable Entity', code: error.code });
  }
}
