import { Logger, type OnModuleDestroy } from '@nestjs/common';
import {
  ConnectedSocket,
  MessageBody,
  SubscribeMessage,
  WebSocketGateway,
  WebSocketServer,
  type OnGatewayDisconnect,
  type OnGatewayInit,
} from '@nestjs/websockets';
import type { Subscription } from 'rxjs';
import type { Namespace, Socket } from 'socket.io';
import { INGEST_EVENTS, NAMESPACES, type AttachReply, type ConnectRefusal, type IngestBatchReply, type RefusedEvent } from '@kilocycle/common/events';
import { BenchesService, type BenchIdentity } from '../benches/benches.service.js';
import { BridgePresence } from '../shared/bridge-presence.js';
import { errorDetail, IngestException, toRefusal } from '../shared/socket-refusal.js';
import { IngestService } from './ingest.service.js';

type BenchSocketData = { bench: BenchIdentity; token: string; verifiedAt: number; runs: Set<number> };
type BenchSocket = Socket<Record<string, never>, Record<string, never>, Record<string, never>, BenchSocketData>;

/** How long a handshake's token check stands before the next request checks it again (a revoke from the CLI). */
const RECHECK_MS = 5000;

function connectError(message: string, code: ConnectRefusal['code']): Error {
  return Object.assign(new Error(message), { data: { code } satisfies ConnectRefusal });
}

/**
 * `/ingest`: bridges authenticate with their bench token, attach to runs assigned to their bench and
 * send numbered batches. Acknowledgements are plain return values (a `{event, data}` return would emit
 * instead of acknowledging); every refusal is also emitted as `refused` for clients that send without one.
 */
@WebSocketGateway({ namespace: NAMESPACES.ingest })
export class IngestGateway implements OnGatewayInit, OnGatewayDisconnect, OnModuleDestroy {
  private readonly logger = new Logger('IngestGateway');
  private subscription: Subscription | null = null;

  @WebSocketServer()
  private readonly nsp: Namespace;

  constructor(
    private readonly ingest: IngestService,
    private readonly benches: BenchesService,
    private readonly presence: BridgePresence,
  ) {}

  afterInit(nsp: Namespace): void {
    nsp.use((socket, next) => {
      const token: unknown = socket.handshake.auth?.token;
      if (typeof token !== 'string' || token === '') {
        return next(
          connectError('no bench token: connect with auth {token} (an admin issues one on the Benches page or with bin/kilocycle bench token)', 'no_token'),
        );
      }
      this.benches
        .findByToken(token)
        .then((bench) => {
          if (!bench) return next(connectError('the bench token is not valid (wrong, or revoked or replaced by an admin)', 'bad_token'));
          if (!bench.active) return next(connectError(`bench "${bench.name}" is deactivated`, 'bench_inactive'));
          const data: BenchSocketData = { bench, token, verifiedAt: Date.now(), runs: new Set() };
          socket.data = data;
          next();
        })
        .catch((error: unknown) => {
          // The detail (a database address, SQL) is for the server's log, not for the bench.
          this.logger.warn(`bench token check failed: ${errorDetail(error)}`);
          next(connectError('the server could not check the bench token just now; try again in a moment', 'server_error'));
        });
    });
    this.subscription = this.benches.credentialsChanged$.subscribe((benchId) => this.dropBench(benchId));
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  /** The runs this bridge fed see it go offline (the live pages' chips, a setting waiting for the counter). */
  handleDisconnect(socket: BenchSocket): void {
    this.presence.disconnected(socket.id);
  }

  @SubscribeMessage(INGEST_EVENTS.attach)
  async attach(@ConnectedSocket() socket: BenchSocket, @MessageBody() payload: unknown): Promise<AttachReply> {
    try {
      await this.recheck(socket, true);
      const ack = await this.ingest.attach(socket.data.bench, payload);
      socket.data.runs.add(ack.runId);
      if (socket.connected) this.presence.attached(ack.runId, socket.id);
      return ack;
    } catch (error) {
      return this.refuse(socket, 'attach', payload, error);
    }
  }

  @SubscribeMessage(INGEST_EVENTS.readings)
  async readings(@ConnectedSocket() socket: BenchSocket, @MessageBody() payload: unknown): Promise<IngestBatchReply> {
    try {
      await this.recheck(socket, false);
      return await this.ingest.ingest(socket.data.bench, socket.data.runs, payload);
    } catch (error) {
      return this.refuse(socket, 'readings', payload, error);
    }
  }

  /** A token replaced or revoked from the command line is noticed within RECHECK_MS. */
  private async recheck(socket: BenchSocket, always: boolean): Promise<void> {
    const data = socket.data;
    if (!always && Date.now() - data.verifiedAt < RECHECK_MS) return;
    const bench = await this.benches.findByToken(data.token);
    if (!bench || bench.id !== data.bench.id || !bench.active) {
      setImmediate(() => socket.disconnect(true));
      throw new IngestException('forbidden', 'the bench token was revoked or replaced, or the bench deactivated; connect again with a new token');
    }
    data.bench = bench;
    data.verifiedAt = Date.now();
  }

  private refuse(socket: BenchSocket, request: RefusedEvent['request'], payload: unknown, error: unknown) {
    const refusal = toRefusal(error);
    if (refusal.code === 'server_error') this.logger.warn(`bench "${socket.data.bench?.name}": ${request} failed: ${errorDetail(error)}`);
    const runId = payload !== null && typeof payload === 'object' ? (payload as { runId?: unknown }).runId : undefined;
    const event: RefusedEvent = { request, runId: typeof runId === 'number' ? runId : null, code: refusal.code, reason: refusal.error };
    (socket as Socket).emit(INGEST_EVENTS.refused, event);
    return refusal;
  }

  private dropBench(benchId: number): void {
    for (const socket of this.nsp.sockets.values()) {
      if ((socket.data as BenchSocketData | undefined)?.bench?.id === benchId) socket.disconnect(true);
    }
  }
}
