import { HttpException, HttpStatus } from '@nestjs/common';
import type { AccessErrorCode, ApiError, PasswordProblem } from '@stillwell/shared/access';
import { assertUnreachable } from './assert-unreachable';

/** The one place that maps each access error code to its HTTP status. */
export function statusOf(code: AccessErrorCode): HttpStatus {
  switch (code) {
    case 'unauthenticated':
    case 'token-expired':
    case 'token-invalid':
    case 'session-ended':
    case 'invalid-credentials':
    case 'totp-required':
    case 'totp-invalid':
    case 'refresh-invalid':
      return HttpStatus.UNAUTHORIZED;
    case 'forbidden':
    case 'step-up-required':
    case 'password-change-required':
    case 'route-not-declared':
    case 'origin-refused':
    case 'wrong-password':
    case 'wrong-totp':
      return HttpStatus.FORBIDDEN;
    case 'too-many-attempts':
    case 'too-many-requests':
      return HttpStatus.TOO_MANY_REQUESTS;
    case 'password-rejected':
      return HttpStatus.BAD_REQUEST;
    case 'user-not-found':
    case 'session-not-found':
      return HttpStatus.NOT_FOUND;
    case 'username-taken':
    case 'last-admin':
    case 'admin-exists':
    case 'totp-already-enabled':
    case 'totp-not-enabled':
    case 'totp-not-started':
      return HttpStatus.CONFLICT;
    default:
      return assertUnreachable(code);
  }
}

const MESSAGES: Readonly<Record<AccessErrorCode, string>> = {
  unauthenticated: 'Sign in first',
  'token-expired': 'The access token has expired; refresh it',
  'token-invalid': 'The access token is not valid',
  'session-ended': 'This session has ended; sign in again',
  forbidden: 'Your roles do not allow this',
  'step-up-required': 'Confirm your password (and code) again to do this',
  'password-change-required': 'Choose a new password first',
  'route-not-declared': 'This route declares no permission, so nobody may use it',
  'invalid-credentials': 'Wrong username or password',
  'totp-required': 'Enter the code from your authenticator',
  'totp-invalid': 'Wrong username, password or code',
  'too-many-attempts': 'Too many failed attempts; wait before trying again',
  'too-many-requests': 'Too many requests from this address; wait before trying again',
  'refresh-invalid': 'No valid session to refresh; sign in again',
  'origin-refused': 'Request from an origin that is not the console',
  'wrong-password': 'Wrong password',
  'wrong-totp': 'Wrong or missing authenticator code',
  'password-rejected': 'That password breaks the password rules',
  'username-taken': 'That username is taken',
  'user-not-found': 'No such user',
  'session-not-found': 'No such session of yours',
  'last-admin': 'That would leave no enabled administrator',
  'admin-exists': 'An administrator exists already',
  'totp-already-enabled': 'A second factor is enabled already; remove it first',
  'totp-not-enabled': 'No second factor is enabled',
  'totp-not-started': 'Begin the second-factor enrolment first',
};

/** A refusal with a machine-readable code (body: ApiError from @stillwell/shared/access). */
export class AccessError extends HttpException {
  constructor(
    readonly code: AccessErrorCode,
    extra: { message?: string; problems?: PasswordProblem[]; retryAfterS?: number } = {},
  ) {
    const status = statusOf(code);
    const body: ApiError = {
      statusCode: status,
      code,
      message: extra.message ?? MESSAGES[code],
      ...(extra.problems ? { problems: extra.problems } : {}),
      ...(extra.retryAfterS !== undefined ? { retryAfterS: extra.retryAfterS } : {}),
    };
    super(body, status);
  }

  get retryAfterS(): number | undefined {
    return (this.getResponse() as ApiError).retryAfterS;
  }
}
