import type { INestApplicationContext } from '@nestjs/common';
import { IoAdapter } from '@nestjs/platform-socket.io';
import { createAdapter } from '@socket.io/redis-adapter';
import type { Redis } from 'ioredis';
import type { SharedRedis } from './shared-redis.js';

/**
 * socket.io through @socket.io/redis-adapter: every namespace's rooms span the nodes, so a reading committed
 * on node A reaches a browser connected to node B. Used only in cluster mode (see setupApp); one publishing
 * and one subscribing connection per node, shared by every namespace.
 */
export class RedisIoAdapter extends IoAdapter {
  private constructor(
    app: INestApplicationContext,
    private readonly adapter: ReturnType<typeof createAdapter>,
  ) {
    super(app);
  }

  /** Opens both connections and waits until they are up; RedisUnreachableError when Redis does not answer. */
  static async connect(app: INestApplicationContext, redis: SharedRedis): Promise<RedisIoAdapter> {
    const [publish, subscribe] = await Promise.all([redis.connectReady('socket.io publish'), redis.connectReady('socket.io subscribe')]);
    return new RedisIoAdapter(app, createAdapter(answered(publish), subscribe));
  }

  // Typed from IoAdapter itself: @nestjs/platform-socket.io brings its own copy of socket.io (one patch
  // apart from ours), and both load the one socket.io-adapter the Redis adapter extends.
  override createIOServer(port: number, options?: Parameters<IoAdapter['createIOServer']>[1]): ReturnType<IoAdapter['createIOServer']> {
    const server = super.createIOServer(port, options) as ReturnType<IoAdapter['createIOServer']> & { adapter(factory: unknown): unknown };
    server.adapter(this.adapter);
    return server;
  }
}

/**
 * The adapter publishes each broadcast and drops the promise: with Redis away, every reading's fan-out
 * would be an unhandled rejection, which ends a Node process. Each publish here gets a handler (the
 * connection already logs the loss once); the reading itself is stored and acknowledged before its
 * fan-out, so a lost broadcast loses nothing but a live update.
 */
function answered(client: Redis): Redis {
  const publish = client.publish.bind(client) as (...args: unknown[]) => Promise<number>;
  (client as unknown as { publish: (...args: unknown[]) => Promise<number> }).publish = (...args: unknown[]) => {
    const sent = publish(...args);
    sent.catch(() => undefined);
    return sent;
  };
  return client;
}
