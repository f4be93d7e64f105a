import type { INestApplication } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import cookieParser from 'cookie-parser';
import helmet from 'helmet';
import type { Env } from '../config';
import {
  answerBodyErrors,
  BODY_LIMIT_BYTES,
  refuseUnknownBodyTypes,
  verifyJson,
} from './body-guards';

/**
 * Headers, CORS and body limits (see body-guards.ts). The CSP allows only this origin: no inline or foreign scripts.
 * style-src needs 'unsafe-inline' because MUI's emotion injects <style> tags at run time (a nonce
 * would need the HTML rendered per request, and the console is served as static files).
 */
export function hardenHttp(app: INestApplication, env: Env): void {
  const express = app as NestExpressApplication;
  if (env.TRUST_PROXY !== undefined) {
    const n = Number(env.TRUST_PROXY);
    express.set('trust proxy', Number.isInteger(n) ? n : env.TRUST_PROXY);
  }
  // unknown body types refused first; JSON depth checked on the raw bytes before it is parsed
  express.use(refuseUnknownBodyTypes);
  express.useBodyParser('json', { limit: BODY_LIMIT_BYTES, verify: verifyJson });
  express.useBodyParser('urlencoded', { limit: BODY_LIMIT_BYTES, extended: false });
  express.use(answerBodyErrors);
  express.use(cookieParser());
  express.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'"],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:'],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'"],
          'object-src': ["'none'"],
          'base-uri': ["'self'"],
          'form-action': ["'self'"],
          'frame-ancestors': ["'none'"],
        },
      },
      // the demo runs on plain http://localhost: HSTS only where it is served over TLS
      strictTransportSecurity: env.DEMO_MODE ? false : { maxAge: 15_552_000 },
    }),
  );
  express.enableCors({ origin: env.CONSOLE_ORIGIN, credentials: true });
}
