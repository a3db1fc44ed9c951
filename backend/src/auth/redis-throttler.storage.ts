import { ServiceUnavailableException } from '@nestjs/common';
import type { ThrottlerStorage } from '@nestjs/throttler/dist/throttler-storage.interface.js';
import type { ThrottlerStorageRecord } from '@nestjs/throttler/dist/throttler-storage-record.interface.js';
import { randomUUID } from 'node:crypto';
import type { SharedRedis } from '../cluster/cluster.module.js';

/**
 * One hit, atomically, as @nestjs/throttler's in-memory storage counts it when there is no block duration:
 * each hit lives `ttl` ms on its own (a sorted set scored by expiry, Redis's clock); at `limit` live hits the
 * call is refused without adding one and answers the seconds until the oldest expires.
 * KEYS[1] the set; ARGV ttl ms, limit, a unique member. Returns {hits, blocked 0/1, ms until oldest expires}.
 */
const HIT = `
local t = redis.call('TIME')
local now = tonumber(t[1]) * 1000 + math.floor(tonumber(t[2]) / 1000)
local ttl = tonumber(ARGV[1])
local limit = tonumber(ARGV[2])
redis.call('ZREMRANGEBYSCORE', KEYS[1], '-inf', now)
local alive = redis.call('ZCARD', KEYS[1])
if alive >= limit then
  local oldest = redis.call('ZRANGE', KEYS[1], 0, 0, 'WITHSCORES')
  return {alive + 1, 1, tonumber(oldest[2]) - now}
end
redis.call('ZADD', KEYS[1], now + ttl, ARGV[3])
local last = redis.call('ZRANGE', KEYS[1], -1, -1, 'WITHSCORES')
redis.call('PEXPIREAT', KEYS[1], tonumber(last[2]))
return {alive + 1, 0, ttl}
`;

/**
 * @nestjs/throttler's ThrottlerStorage in the shared Redis, so that every node counts the same sign-in
 * failures. Written here on ioredis (as the issue allows) because the published Redis storage for the
 * throttler declares NestJS 11 at most as its peer and this backend runs NestJS 12. Only the counting the
 * sign-in throttle uses is offered: hits that expire one by one, no block duration.
 */
export class RedisThrottlerStorage implements ThrottlerStorage {
  constructor(
    private readonly redis: SharedRedis,
    private readonly prefix = 'kc:throttle:',
  ) {}

  async increment(key: string, ttl: number, limit: number, blockDuration: number, throttlerName: string): Promise<ThrottlerStorageRecord> {
    if (blockDuration > 0) throw new Error('RedisThrottlerStorage counts hits that expire one by one: a block duration is not supported');
    let answer: [number, number, number];
    try {
      answer = (await this.redis.client.eval(HIT, 1, `${this.prefix}${throttlerName}:${key}`, ttl, limit, randomUUID())) as [number, number, number];
    } catch (error) {
      // Unthrottled sign-ins are not an option: refuse until the shared counts are back.
      throw new ServiceUnavailableException(
        `the shared sign-in counts cannot be reached (Redis: ${error instanceof Error ? error.message : String(error)}); try again shortly`,
      );
    }
    const [hits, blocked, msLeft] = answer;
    const seconds = Math.max(0, Math.ceil(msLeft / 1000));
    return { totalHits: hits, timeToExpire: seconds, isBlocked: blocked === 1, timeToBlockExpire: blocked === 1 ? seconds : 0 };
  }
}
