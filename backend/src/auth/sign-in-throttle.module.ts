import { Module } from '@nestjs/common';
// Deep imports of the two files used: the package's index also loads its guard and module, which need
// all of @nestjs/common; these two need only its Injectable (see test/support/jest-resolver.cjs).
import { ThrottlerStorage } from '@nestjs/throttler/dist/throttler-storage.interface.js';
import { ThrottlerStorageService } from '@nestjs/throttler/dist/throttler.service.js';
import { SignInThrottle } from './sign-in-throttle.service.js';

/**
 * Sign-in and sign-off throttling. The counts live in @nestjs/throttler's in-memory storage for now
 * (one app process per lab); a later issue provides a Redis ThrottlerStorage here instead, so several
 * nodes share them. Imported by the auth and reviews modules (one instance: Nest modules are singletons).
 */
@Module({
  providers: [{ provide: ThrottlerStorage, useClass: ThrottlerStorageService }, SignInThrottle],
  exports: [SignInThrottle],
})
export class SignInThrottleModule {}
