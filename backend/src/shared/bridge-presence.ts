import { Injectable } from '@nestjs/common';
import { Subject, type Observable } from 'rxjs';

/** A run's bridge state: connected since, or offline since. */
export type BridgePresenceState = { connected: boolean; since: Date };
export type BridgePresenceChange = { runId: number; connected: boolean; since: Date };

/**
 * Which runs a connected bench bridge is attached to. Kept behind this one interface (the Nest token is
 * the class itself) so that the state can move to a shared store when the app runs on several processes;
 * today it lives in this process's memory ({@link MemoryBridgePresence}).
 */
export abstract class BridgePresence {
  /** A bridge connection attached to a run (the gateway calls it after a successful attach). */
  abstract attached(runId: number, connectionId: string): void;
  /** A bridge connection closed: every run it fed loses it. */
  abstract disconnected(connectionId: string): void;
  /** The run's state, or null when no bridge has attached to it since this process started. */
  abstract state(runId: number): BridgePresenceState | null;
  /** The run's first bridge came online, or its last one went offline. */
  abstract readonly changes$: Observable<BridgePresenceChange>;
}

@Injectable()
export class MemoryBridgePresence extends BridgePresence {
  private readonly connections = new Map<number, Set<string>>();
  private readonly runsOf = new Map<string, Set<number>>();
  private readonly states = new Map<number, BridgePresenceState>();
  private readonly subject = new Subject<BridgePresenceChange>();
  readonly changes$ = this.subject.asObservable();

  attached(runId: number, connectionId: string): void {
    const set = this.connections.get(runId) ?? new Set<string>();
    const wasOnline = set.size > 0;
    set.add(connectionId);
    this.connections.set(runId, set);
    const runs = this.runsOf.get(connectionId) ?? new Set<number>();
    runs.add(runId);
    this.runsOf.set(connectionId, runs);
    if (!wasOnline) this.change(runId, true);
  }

  disconnected(connectionId: string): void {
    const runs = this.runsOf.get(connectionId);
    if (!runs) return;
    this.runsOf.delete(connectionId);
    for (const runId of runs) {
      const set = this.connections.get(runId);
      if (!set) continue;
      set.delete(connectionId);
      if (set.size === 0) {
        this.connections.delete(runId);
        this.change(runId, false);
      }
    }
  }

  state(runId: number): BridgePresenceState | null {
    return this.states.get(runId) ?? null;
  }

  private change(runId: number, connected: boolean): void {
    const since = new Date();
    this.states.set(runId, { connected, since });
    this.subject.next({ runId, connected, since });
  }
}
