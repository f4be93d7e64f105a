import type { INestApplication } from '@nestjs/common';
import { IngestionService } from '../../telemetry/ingestion.service';
import { RedisIoAdapter } from './redis-io.adapter';
import { StoredFeed } from './stored-feed';

/**
 * With REDIS_URL set, several gateways serve one site: socket.io emits cross over Redis, and
 * each gateway hears the readings the others stored (StoredFeed). Without it, nothing changes.
 */
export function scaleOut(app: INestApplication, redisUrl: string | undefined): void {
  if (!redisUrl) return;
  const feed = new StoredFeed(redisUrl, app.get(IngestionService).stored$);
  app.useWebSocketAdapter(new RedisIoAdapter(app, redisUrl, [feed]));
}
