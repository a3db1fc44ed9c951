/**
 * Counts failed sign-ins per key (an account's e-mail or a client address) in a sliding window.
 * Kept in memory: one server process per lab, and a restart forgetting the counts is acceptable.
 */
export class LoginThrottle {
  private readonly failures = new Map<string, number[]>();

  constructor(
    private readonly maxFailures = 10,
    private readonly windowMs = 60_000,
    private readonly now: () => number = Date.now,
  ) {}

  isBlocked(keys: readonly string[]): boolean {
    return keys.some((key) => this.recent(key).length >= this.maxFailures);
  }

  recordFailure(keys: readonly string[]): void {
    const at = this.now();
    for (const key of keys) this.failures.set(key, [...this.recent(key), at]);
  }

  private recent(key: string): number[] {
    const since = this.now() - this.windowMs;
    const kept = (this.failures.get(key) ?? []).filter((t) => t > since);
    if (kept.length === 0) this.failures.delete(key);
    else this.failures.set(key, kept);
    return kept;
  }
}
