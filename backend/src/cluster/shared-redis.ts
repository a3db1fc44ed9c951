import { Inject, Injectable, Logger, type OnApplicationShutdown, type OnModuleInit } from '@nestjs/common';
import { Redis } from 'ioredis';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';

/** How long a node waits for Redis at start before it refuses to start. */
const START_TIMEOUT_MS = 5000;

/** Redis unreachable when a cluster node starts: the start is refused with this message. */
export class RedisUnreachableError extends Error {
  constructor(url: string, reason: string) {
    super(`Redis at ${redactUrl(url)} does not answer (${reason}): start it, or fix KC_REDIS_URL, then start this node again`);
    this.name = 'RedisUnreachableError';
  }
}

/** The address without a password, for messages and logs. */
export function redactUrl(url: string): string {
  return url.replace(/\/\/([^@/]*)@/, '//***@');
}

/**
 * The node's connections to the shared Redis (KC_REDIS_URL), through ioredis. Present only in cluster
 * mode: `enabled` is false for the single process of `bin/kilocycle start`, which keeps its live rooms and
 * throttles in memory. A node whose Redis does not answer at start refuses to start (onModuleInit throws);
 * lost later, commands fail fast instead of queueing (readiness then reports Redis down).
 */
@Injectable()
export class SharedRedis implements OnModuleInit, OnApplicationShutdown {
  private readonly logger = new Logger('SharedRedis');
  private readonly clients: Redis[] = [];
  private main: Redis | null = null;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {}

  get enabled(): boolean {
    return this.config.cluster !== null;
  }

  async onModuleInit(): Promise<void> {
    if (this.config.cluster) this.main = await this.connectReady('commands');
  }

  /**
   * A connection of this node's own, once it is up (socket.io's adapter needs one to publish and one to
   * subscribe; the node one for commands). Redis not answering within 5 s: RedisUnreachableError, and the
   * connection is dropped. Once up it reconnects by itself with a growing delay, and a command sent while
   * it is down fails at once (nothing waits in a queue to run later).
   */
  async connectReady(purpose: string): Promise<Redis> {
    if (!this.config.cluster) throw new Error('Redis is not configured: KC_REDIS_URL is unset (single-process mode)');
    const url = this.config.cluster.redisUrl;
    const client = new Redis(url, {
      lazyConnect: true,
      maxRetriesPerRequest: 1,
      enableOfflineQueue: false,
      connectTimeout: START_TIMEOUT_MS,
      retryStrategy: () => null,
    });
    client.on('error', () => undefined);
    try {
      await client.connect();
    } catch (error) {
      client.disconnect();
      throw new RedisUnreachableError(url, error instanceof Error ? error.message : String(error));
    }
    // Up: from now on, reconnect after a loss (retryStrategy is read at each loss) and say so once each way.
    client.options.retryStrategy = (attempt) => Math.min(200 * attempt, 2000);
    let down = false;
    client.removeAllListeners('error');
    client.on('error', (error: Error) => {
      if (!down) this.logger.error(`Redis (${purpose}) lost: ${error.message}`);
      down = true;
    });
    client.on('ready', () => {
      if (down) this.logger.warn(`Redis (${purpose}) back`);
      down = false;
    });
    this.clients.push(client);
    return client;
  }

  /** The connection for commands (throttles, locks, pings). */
  get client(): Redis {
    if (!this.main) throw new Error('Redis is not configured: KC_REDIS_URL is unset (single-process mode)');
    return this.main;
  }

  /** PING with a time limit; throws when Redis does not answer (the readiness check). */
  async ping(timeoutMs = 2000): Promise<void> {
    let timer: NodeJS.Timeout | undefined;
    try {
      await Promise.race([
        this.client.ping(),
        new Promise((_, reject) => {
          timer = setTimeout(() => reject(new Error(`no answer in ${timeoutMs} ms`)), timeoutMs);
        }),
      ]);
    } finally {
      clearTimeout(timer);
    }
  }

  onApplicationShutdown(): void {
    for (const client of this.clients) client.disconnect();
    this.clients.length = 0;
    this.main = null;
  }
}
