import { ValidationPipe, type INestApplication } from '@nestjs/common';
import { DocumentBuilder, SwaggerModule } from '@nestjs/swagger';
import { scaleOut } from './common/cluster/scale-out';
import { hardenHttp } from './common/http-hardening';
import { validateEnv } from './config';

/** Everything main.ts applies to the app, shared with the integration tests so they test the same thing. */
export function setupApp(app: INestApplication): void {
  const env = validateEnv(process.env);
  hardenHttp(app, env);
  scaleOut(app, env.REDIS_URL);
  app.setGlobalPrefix('api');
  app.useGlobalPipes(
    new ValidationPipe({ whitelist: true, forbidNonWhitelisted: true, transform: true }),
  );
  app.enableShutdownHooks();
  const document = SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setTitle('Stillwell gateway')
      .setDescription(
        'Reservoir telemetry, forecasts and operations. Forecasts are decision support.',
      )
      .setVersion('0.1.0')
      .addBearerAuth()
      .build(),
  );
  SwaggerModule.setup('api/docs', app, document, { jsonDocumentUrl: 'api/docs-json' });
}
