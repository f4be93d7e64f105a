import { applyDecorators, SetMetadata } from '@nestjs/common';
import {
  ApiBearerAuth,
  ApiExtension,
  ApiForbiddenResponse,
  ApiUnauthorizedResponse,
} from '@nestjs/swagger';
import type { Action } from '@stillwell/shared/access';

export const PERMISSION_KEY = 'stillwell:permission';

/**
 * The action a route performs; the global guard allows it to the roles the permission matrix
 * (@stillwell/shared/access) gives that action. Shown as x-permission in the API doc.
 */
export const Permission = (action: Action) =>
  applyDecorators(
    SetMetadata(PERMISSION_KEY, action),
    ApiBearerAuth(),
    ApiExtension('x-permission', action),
    ApiUnauthorizedResponse({
      description: 'no valid access token (code: unauthenticated, token-expired, ...)',
    }),
    ApiForbiddenResponse({ description: `the roles do not allow ${action} (code: forbidden)` }),
  );
