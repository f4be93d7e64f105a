import { z } from 'zod';

/** The console's build-time settings, read once and checked here; nothing else reads import.meta.env. */
const envSchema = z.object({
  /** The gateway's origin. Empty means same origin: the dev proxy, or the gateway serving dist. */
  VITE_GATEWAY_ORIGIN: z.union([z.literal(''), z.url()]).default(''),
});

function readEnv() {
  const parsed = envSchema.safeParse(import.meta.env);
  if (!parsed.success) {
    throw new Error(`Console settings are invalid: ${z.prettifyError(parsed.error)}`);
  }
  return {
    gatewayOrigin: parsed.data.VITE_GATEWAY_ORIGIN.replace(/\/+$/, ''),
  };
}

export const env = readEnv();
