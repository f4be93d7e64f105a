import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { AppModule } from './app.module';
import { validateEnv } from './config';
import { setupApp } from './setup-app';

async function bootstrap(): Promise<void> {
  const env = validateEnv(process.env);
  const app = await NestFactory.create(AppModule.register());
  setupApp(app);
  await app.listen(env.PORT, env.HOST);
  Logger.log(`Stillwell is on http://localhost:${env.PORT} (API docs at /api/docs)`, 'Bootstrap');
}

bootstrap().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
