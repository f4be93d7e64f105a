import type { INestApplicationContext } from '@nestjs/common';
import { IoAdapter } from '@nestjs/platform-socket.io';
import { createAdapter } from '@socket.io/redis-adapter';
import { Redis } from 'ioredis';
import type { Server, ServerOptions } from 'socket.io';

/**
 * socket.io over Redis pub/sub (@socket.io/redis-adapter): an emit to a room on one gateway reaches
 * the consoles in that room on every gateway. The clients connect lazily and retry on their own.
 */
export class RedisIoAdapter extends IoAdapter {
  private readonly pub: Redis;
  private readonly sub: Redis;

  constructor(
    app: INestApplicationContext,
    url: string,
    /** closed with the adapter, when the app closes */
    private readonly alsoClose: Array<{ close(): void }> = [],
  ) {
    super(app);
    this.pub = new Redis(url, { maxRetriesPerRequest: null });
    this.sub = this.pub.duplicate();
  }

  override createIOServer(port: number, options?: ServerOptions): Server {
    const server = super.createIOServer(port, options) as Server;
    server.adapter(createAdapter(this.pub, this.sub, { key: 'stillwell:io' }));
    return server;
  }

  override async dispose(): Promise<void> {
    await super.dispose();
    for (const c of this.alsoClose) c.close();
    this.pub.disconnect();
    this.sub.disconnect();
  }
}
