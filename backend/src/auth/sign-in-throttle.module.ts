import { Module } from '@nestjs/common';
// Deep imports of the two files used: the package's index also loads its guard and module, which need
// all of @nestjs/common; these two need only its Injectable (see test/support/jest-resolver.cjs).
import { ThrottlerStorage } from '@nestjs/throttler/dist/throttler-storage.interface.js';
import { ThrottlerStorageService } from '@nestjs/throttler/dist/throttler.service.js';
import { SharedRedis } from '../cluster/cluster.module.js';
import { RedisThrottlerStorage } from './redis-throttler.storage.js';
import { SignInThrottle } from './sign-in-throttle.service.js';

/**
 * Sign-in and sign-off throttling. The counts live in @nestjs/throttler's in-memory storage for the one
 * process of `bin/kilocycle start`, and in the shared Redis in cluster mode (KC_REDIS_URL), so that failures
 * spread over several nodes add up. Imported by the auth and reviews modules (one instance: Nest modules are
 * singletons).
 */
@Module({
  providers: [
    {
      provide: ThrottlerStorage,
      inject: [SharedRedis],
      useFactory: (redis: SharedRedis) => (redis.enabled ? new RedisThrottlerStorage(redis) : new ThrottlerStorageService()),
    },
    SignInThrottle,
  ],
  exports: [SignInThrottle],
})
export class SignInThrottleModule {}
