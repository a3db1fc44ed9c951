import { Inject, Injectable } from '@nestjs/common';
import { ThrottlerStorage } from '@nestjs/throttler/dist/throttler-storage.interface.js';
import { TooManyAttemptsException } from '../shared/too-many-attempts.js';

/**
 * The numbers of sign-in protection (decided for issue #13; README "Sign-in protection" says the same):
 * - per account + address: the first PAIR_FREE_FAILURES wrong passwords within PAIR_MEMORY_MS cost
 *   nothing; after that, each further attempt from that pair must wait 2^k seconds (2, 4, 8 … after
 *   the 5th, 6th, 7th … failure), at most PAIR_MAX_WAIT_S. The same account from another address is
 *   not held back, so the right password from the owner's own machine still signs in.
 * - per address (all accounts together): ADDRESS_MAX_FAILURES failures within ADDRESS_WINDOW_MS, then
 *   429 until the oldest of them is older than the window (so spraying many accounts is bounded too).
 * - the sign-off password prompt, per user: SIGN_OFF_MAX_FAILURES wrong passwords within
 *   SIGN_OFF_WINDOW_MS, then 429 until the oldest is older than the window.
 */
export const PAIR_FREE_FAILURES = 5;
export const PAIR_MEMORY_MS = 60 * 60_000;
export const PAIR_MAX_WAIT_S = 15 * 60;
export const ADDRESS_MAX_FAILURES = 30;
export const ADDRESS_WINDOW_MS = 15 * 60_000;
export const SIGN_OFF_MAX_FAILURES = 5;
export const SIGN_OFF_WINDOW_MS = 15 * 60_000;

/** Seconds the pair must wait after its n-th failure in memory (0 while n is within the free ones). */
export function pairWaitSeconds(failures: number): number {
  if (failures < PAIR_FREE_FAILURES) return 0;
  return Math.min(2 ** (failures - PAIR_FREE_FAILURES + 1), PAIR_MAX_WAIT_S);
}

const NO_LIMIT = Number.MAX_SAFE_INTEGER;

function waitWords(seconds: number): string {
  if (seconds < 120) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  return `${Math.ceil(seconds / 60)} minutes`;
}

/**
 * Sign-in and sign-off throttling on @nestjs/throttler's ThrottlerStorage. Each failure is one hit that
 * lives as long as it should count; a check asks with limit L whether L hits are alive (the storage then
 * answers isBlocked and the seconds until the oldest expires, adding only a hit of 1 ms when not blocked).
 * The storage is the package's in-memory one for a single process, RedisThrottlerStorage in cluster mode
 * (see SignInThrottleModule), so several app nodes share the counts.
 */
@Injectable()
export class SignInThrottle {
  constructor(@Inject(ThrottlerStorage) private readonly storage: ThrottlerStorage) {}

  /** Throws 429 (with Retry-After) when this address, or this account from this address, must wait. */
  async checkSignIn(email: string, address: string): Promise<void> {
    const byAddress = await this.alive(`address:${address}`, 'sign-in-address', ADDRESS_MAX_FAILURES);
    if (byAddress > 0) this.tooMany(byAddress, `Too many failed sign-ins from this address; try again in ${waitWords(byAddress)}`);
    const byPair = await this.alive(`wait:${email.toLowerCase()}|${address}`, 'sign-in-wait', 1);
    if (byPair > 0) this.tooMany(byPair, `Too many failed sign-ins for this account from this address; try again in ${waitWords(byPair)}`);
  }

  async recordSignInFailure(email: string, address: string): Promise<void> {
    const pair = `${email.toLowerCase()}|${address}`;
    await this.storage.increment(`address:${address}`, ADDRESS_WINDOW_MS, NO_LIMIT, 0, 'sign-in-address');
    const { totalHits } = await this.storage.increment(`failures:${pair}`, PAIR_MEMORY_MS, NO_LIMIT, 0, 'sign-in-failures');
    const wait = pairWaitSeconds(totalHits);
    if (wait > 0) await this.storage.increment(`wait:${pair}`, wait * 1000, NO_LIMIT, 0, 'sign-in-wait');
  }

  /** Throws 429 when this user has given too many wrong passwords at sign-off lately. */
  async checkSignOff(userId: number): Promise<void> {
    const wait = await this.alive(`sign-off:${userId}`, 'sign-off', SIGN_OFF_MAX_FAILURES);
    if (wait > 0) this.tooMany(wait, `Too many wrong passwords at signing; try again in ${waitWords(wait)}`);
  }

  async recordSignOffFailure(userId: number): Promise<void> {
    await this.storage.increment(`sign-off:${userId}`, SIGN_OFF_WINDOW_MS, NO_LIMIT, 0, 'sign-off');
  }

  /** Seconds until fewer than `limit` hits are alive under key (0 when fewer are alive now). */
  private async alive(key: string, name: string, limit: number): Promise<number> {
    const record = await this.storage.increment(key, 1, limit, 0, name);
    return record.isBlocked ? Math.max(1, record.timeToBlockExpire) : 0;
  }

  private tooMany(seconds: number, message: string): never {
    throw new TooManyAttemptsException(seconds, message);
  }
}
