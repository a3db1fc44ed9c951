import { Logger, UnauthorizedException, type OnModuleDestroy } from '@nestjs/common';
import { ConnectedSocket, MessageBody, SubscribeMessage, WebSocketGateway, type OnGatewayInit } from '@nestjs/websockets';
import type { Subscription } from 'rxjs';
import type { Namespace, Socket } from 'socket.io';
import {
  LIVE_EVENTS,
  NAMESPACES,
  runRoom,
  userRoom,
  type ConnectRefusal,
  type JoinReply,
  type LeaveReply,
  type LiveBridgeEvent,
  type LiveCaptureEvent,
  type LiveExclusionEvent,
  type LiveImportProgressEvent,
  type LiveReadingsEvent,
  toLiveReadingsEvent,
} from '@kilocycle/common/events';
import type { AuthUser } from '../shared/auth-user.js';
import { AuthService } from '../auth/auth.service.js';
import { SharedRedis } from '../cluster/cluster.module.js';
import { AccountSessions, type SessionsEnded } from '../shared/account-sessions.js';
import { BridgePresence } from '../shared/bridge-presence.js';
import { CounterCaptureService } from '../ingest/counter-capture.service.js';
import { ImportProgressService } from '../imports/import-progress.service.js';
import { errorDetail, toRefusal } from '../shared/socket-refusal.js';
import { ReadingsWriter } from '../readings/readings-writer.service.js';
import { LiveService } from './live.service.js';

type LiveSocketData = { user: AuthUser; token: string; expiry?: NodeJS.Timeout };
type LiveSocket = Socket<Record<string, never>, Record<string, never>, Record<string, never>, LiveSocketData>;

const sessionRoom = (jti: string) => `session:${jti}`;

/** setTimeout's limit (about 24.8 days); a longer session is re-armed when the timer fires. */
const MAX_TIMER_MS = 2 ** 31 - 1;

/**
 * `/live`: browsers authenticate with the session's JWT and join the room of each run they show;
 * every batch the write path commits (bridge, bench page or import) and every exclusion is pushed to
 * that run's room. Each socket also joins its user's room, where the progress of the user's imports goes
 * (ImportProgressService.changes$). A socket lives only as long as its session: every incoming event checks the session
 * again, an ended session (sign-out, deactivation, role or password change) closes its sockets at once,
 * and each socket is closed when its token expires.
 */
@WebSocketGateway({ namespace: NAMESPACES.live })
export class LiveGateway implements OnGatewayInit, OnModuleDestroy {
  private readonly logger = new Logger('LiveGateway');
  private readonly subscriptions: Subscription[] = [];

  constructor(
    private readonly auth: AuthService,
    private readonly live: LiveService,
    private readonly writer: ReadingsWriter,
    private readonly sessions: AccountSessions,
    private readonly presence: BridgePresence,
    private readonly captures: CounterCaptureService,
    private readonly redis: SharedRedis,
    private readonly imports: ImportProgressService,
  ) {}

  /**
   * Whether anyone may watch the run: socket.io encodes a broadcast even for an empty room, so runs nobody
   * watches are skipped. Only this node's rooms are known here, so in cluster mode every event goes out
   * (through Redis, to the nodes whose browsers watch it).
   */
  private watched(nsp: Namespace, runId: number): boolean {
    return this.redis.enabled || (nsp.adapter.rooms.get(runRoom(runId))?.size ?? 0) > 0;
  }

  afterInit(nsp: Namespace): void {
    nsp.use((socket, next) => {
      const token: unknown = socket.handshake.auth?.token;
      const refuse = (message: string) => next(Object.assign(new Error(message), { data: { code: 'bad_session' } satisfies ConnectRefusal }));
      if (typeof token !== 'string' || token === '') return refuse('sign in first: connect with auth {token} (the session token)');
      this.auth
        .authenticate(token)
        .then((user) => {
          const data: LiveSocketData = { user, token };
          socket.data = data;
          next();
        })
        .catch((error: unknown) => refuse(error instanceof Error ? error.message : 'the session is not valid; sign in again'));
    });
    nsp.on('connection', (socket: LiveSocket) => {
      // Rooms of its account (its imports' progress) and its session (an ended session closes its sockets on
      // every node).
      void socket.join([userRoom(socket.data.user.id), sessionRoom(socket.data.user.jti)]);
      this.closeAtExpiry(socket);
      socket.on('disconnect', () => clearTimeout(socket.data.expiry));
    });
    // Fan-out after the commit: one encode per batch, whatever the number of watchers.
    this.subscriptions.push(
      this.sessions.ended$.subscribe((ended) => this.closeSessions(nsp, ended)),
      this.writer.stored$.subscribe(({ runId, author, readings }) => {
        if (!this.watched(nsp, runId)) return;
        const event: LiveReadingsEvent = toLiveReadingsEvent(runId, author, readings);
        nsp.to(runRoom(runId)).emit(LIVE_EVENTS.readings, event);
      }),
      this.writer.excluded$.subscribe(({ runId, reading }) => {
        if (!this.watched(nsp, runId)) return;
        const event: LiveExclusionEvent = { runId, reading };
        nsp.to(runRoom(runId)).emit(LIVE_EVENTS.excluded, event);
      }),
      this.presence.changes$.subscribe(({ runId, connected, since }) => {
        if (!this.watched(nsp, runId)) return;
        const event: LiveBridgeEvent = { runId, connected, since: since.toISOString() };
        nsp.to(runRoom(runId)).emit(LIVE_EVENTS.bridge, event);
      }),
      this.imports.changes$.subscribe(({ userId, progress }) => {
        if (!this.redis.enabled && (nsp.adapter.rooms.get(userRoom(userId))?.size ?? 0) === 0) return;
        const event: LiveImportProgressEvent = progress;
        nsp.to(userRoom(userId)).emit(LIVE_EVENTS.importProgress, event);
      }),
      this.captures.events$.subscribe((capture) => {
        if (!this.watched(nsp, capture.runId)) return;
        const event: LiveCaptureEvent = { runId: capture.runId, capture, sentAt: new Date().toISOString() };
        nsp.to(runRoom(capture.runId)).emit(LIVE_EVENTS.capture, event);
      }),
    );
  }

  onModuleDestroy(): void {
    for (const subscription of this.subscriptions) subscription.unsubscribe();
  }

  private closeAtExpiry(socket: LiveSocket): void {
    const left = socket.data.user.exp * 1000 - Date.now();
    if (left <= 0) {
      socket.disconnect(true);
      return;
    }
    socket.data.expiry = setTimeout(() => (left > MAX_TIMER_MS ? this.closeAtExpiry(socket) : socket.disconnect(true)), Math.min(left, MAX_TIMER_MS));
    socket.data.expiry.unref();
  }

  /** Closes the sockets of ended sessions, on this node and (through the Redis adapter) on every other. */
  private closeSessions(nsp: Namespace, ended: SessionsEnded): void {
    const rooms = ended.kind === 'users' ? ended.userIds.map(userRoom) : [sessionRoom(ended.jti)];
    if (rooms.length > 0) nsp.in(rooms).disconnectSockets(true);
  }

  /** The session behind a socket, checked again for this event; an ended session closes the socket. */
  private async session(socket: LiveSocket): Promise<AuthUser> {
    try {
      const user = await this.auth.authenticate(socket.data.token);
      socket.data.user = user;
      return user;
    } catch (error) {
      if (error instanceof UnauthorizedException) setImmediate(() => socket.disconnect(true));
      throw error;
    }
  }

  @SubscribeMessage(LIVE_EVENTS.join)
  async join(@ConnectedSocket() socket: LiveSocket, @MessageBody() payload: unknown): Promise<JoinReply> {
    try {
      const user = await this.session(socket);
      const { runId, lastSeq } = await this.live.runFor(user, payload);
      await socket.join(runRoom(runId));
      return { ok: true, runId, lastSeq };
    } catch (error) {
      if (error instanceof UnauthorizedException) return { ok: false, code: 'forbidden', error: error.message };
      const refusal = toRefusal(error);
      if (refusal.code === 'server_error') this.logger.warn(`join failed: ${errorDetail(error)}`);
      return refusal;
    }
  }

  @SubscribeMessage(LIVE_EVENTS.leave)
  async leave(@ConnectedSocket() socket: LiveSocket, @MessageBody() payload: unknown): Promise<LeaveReply> {
    const runId = payload !== null && typeof payload === 'object' ? (payload as { runId?: unknown }).runId : undefined;
    if (typeof runId !== 'number' || !Number.isInteger(runId))
      return { ok: false, code: 'bad_request', error: 'runId must be a whole number (the id of a run)' };
    try {
      await this.session(socket);
      await socket.leave(runRoom(runId));
      return { ok: true, runId };
    } catch (error) {
      if (error instanceof UnauthorizedException) return { ok: false, code: 'forbidden', error: error.message };
      const refusal = toRefusal(error);
      if (refusal.code === 'server_error') this.logger.warn(`leave failed: ${refusal.error}`);
      return refusal;
    }
  }
}
