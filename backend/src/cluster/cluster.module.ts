import { Global, Module } from '@nestjs/common';
import { SharedRedis } from './shared-redis.js';

export { namedLockIsFree, namedLockName, withNamedLock, type NamedLockOutcome } from './named-lock.js';
export { RedisIoAdapter } from './redis-io.adapter.js';
export { RedisUnreachableError, SharedRedis } from './shared-redis.js';

/**
 * What several app nodes share beyond MariaDB: the Redis connections (KC_REDIS_URL). In the single-process
 * default nothing here connects anywhere (SharedRedis.enabled is false).
 */
@Global()
@Module({ providers: [SharedRedis], exports: [SharedRedis] })
export class ClusterModule {}
