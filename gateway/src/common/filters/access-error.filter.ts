import { ArgumentsHost, Catch, ExceptionFilter } from '@nestjs/common';
import type { Response } from 'express';
import { AccessError } from '../errors/access-error';

/** Sends an AccessError's body as it is, with Retry-After when it says how long to wait. */
@Catch(AccessError)
export class AccessErrorFilter implements ExceptionFilter {
  catch(error: AccessError, host: ArgumentsHost): void {
    if (host.getType() !== 'http') throw error;
    const res = host.switchToHttp().getResponse<Response>();
    if (error.retryAfterS !== undefined) res.setHeader('Retry-After', String(error.retryAfterS));
    res.status(error.getStatus()).json(error.getResponse());
  }
}
