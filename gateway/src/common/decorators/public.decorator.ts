import { applyDecorators, SetMetadata } from '@nestjs/common';
import { ApiExtension } from '@nestjs/swagger';

export const IS_PUBLIC_KEY = 'stillwell:public';

/** Opts a route out of sign-in (sign-in itself, refresh, health). Shown as x-public in the API doc. */
export const Public = () =>
  applyDecorators(SetMetadata(IS_PUBLIC_KEY, true), ApiExtension('x-public', true));
