import { HttpException, HttpStatus } from '@nestjs/common';
import type { Refusal } from '@stillwell/shared/alarms';
import { assertUnreachable } from '../common/errors/assert-unreachable';

/** The one place that maps a refused alarm action to its HTTP status (400: the request, 409: the state). */
export function refusalStatus(refusal: Refusal): HttpStatus {
  switch (refusal) {
    case 'reason-required':
    case 'expiry-not-in-future':
    case 'expiry-too-far':
      return HttpStatus.BAD_REQUEST;
    case 'already-acknowledged':
    case 'not-in-service':
    case 'already-in-service':
      return HttpStatus.CONFLICT;
    default:
      return assertUnreachable(refusal);
  }
}

/** A refused transition, with its stable code for the console. */
export class AlarmRefusedError extends HttpException {
  constructor(
    readonly refusal: Refusal,
    message: string,
  ) {
    const status = refusalStatus(refusal);
    super(
      {
        statusCode: status,
        error: status === 409 ? 'Conflict' : 'Bad Request',
        message,
        code: refusal,
      },
      status,
    );
  }
}
