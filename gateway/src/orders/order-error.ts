import { HttpException, HttpStatus } from '@nestjs/common';
import type { InterlockReport, OrderErrorBody, OrderErrorCode } from '@stillwell/shared/orders';
import { assertUnreachable } from '../common/errors/assert-unreachable';

/** The one place that maps each order refusal to its HTTP status. */
export function orderStatusOf(code: OrderErrorCode): HttpStatus {
  switch (code) {
    case 'invalid-order':
    case 'rule-invalid':
      return HttpStatus.BAD_REQUEST;
    case 'order-not-found':
      return HttpStatus.NOT_FOUND;
    case 'own-order':
    case 'countersign-self':
    case 'engineer-required':
      return HttpStatus.FORBIDDEN;
    case 'wrong-state':
    case 'not-authorised':
    case 'authorisation-lapsed':
    case 'countersign-not-needed':
    case 'emergency-active':
    case 'no-emergency':
      return HttpStatus.CONFLICT;
    case 'interlock':
      return HttpStatus.UNPROCESSABLE_ENTITY;
    default:
      return assertUnreachable(code);
  }
}

/** A refusal with a machine-readable code the console can act on (body: OrderErrorBody). */
export class OrderError extends HttpException {
  constructor(
    readonly code: OrderErrorCode,
    message: string,
    interlocks?: InterlockReport,
  ) {
    const status = orderStatusOf(code);
    const body: OrderErrorBody = {
      statusCode: status,
      code,
      message,
      ...(interlocks ? { interlocks } : {}),
    };
    super(body, status);
  }
}
