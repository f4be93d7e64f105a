import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { INestApplication, Type } from '@nestjs/common';
import { Test, type TestingModuleBuilder } from '@nestjs/testing';
import { AppModule } from '../../src/app.module';
import { setupApp } from '../../src/setup-app';

export interface TestGateway {
  app: INestApplication;
  url: string;
  databasePath: string;
  close(): Promise<void>;
}

/** The real gateway on a temporary SQLite file, configured only through its environment variables. */
export async function startTestGateway(
  env: Record<string, string>,
  options: {
    imports?: Type[];
    /** e.g. replace an injectable seam (b.overrideProvider(TOKEN).useClass(...)) */
    override?: (builder: TestingModuleBuilder) => TestingModuleBuilder;
  } = {},
): Promise<TestGateway> {
  const dir = mkdtempSync(join(tmpdir(), 'stillwell-gw-'));
  const databasePath = join(dir, 'test.sqlite');
  Object.assign(process.env, {
    DATABASE_PATH: databasePath,
    CONSOLE_DIST: join(dir, 'no-console'),
    INGEST_FLUSH_MS: '10',
    STATUS_PUSH_MS: '200',
    MQTT_CLIENT_ID: `stillwell-test-${process.pid}-${Date.now()}`,
    ...env,
  });
  const builder = Test.createTestingModule({
    imports: [AppModule.register(), ...(options.imports ?? [])],
  });
  const moduleRef = await (options.override?.(builder) ?? builder).compile();
  const app = moduleRef.createNestApplication({ logger: ['error', 'warn'] });
  setupApp(app);
  await app.listen(0, '127.0.0.1');
  return {
    app,
    url: await app.getUrl(),
    databasePath,
    close: async () => {
      await app.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/** Polls until the check passes or the time is up (the test then fails with the check's own error). */
export async function eventually(
  check: () => void | Promise<void>,
  timeoutMs = 10_000,
): Promise<void> {
  const start = Date.now();
  for (;;) {
    try {
      await check();
      return;
    } catch (error) {
      if (Date.now() - start > timeoutMs) throw error;
      await new Promise((r) => setTimeout(r, 25));
    }
  }
}
