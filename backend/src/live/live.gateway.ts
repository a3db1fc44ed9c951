import { Logger, UnauthorizedException, type OnModuleDestroy } from '@nestjs/common';
import { ConnectedSocket, MessageBody, SubscribeMessage, WebSocketGateway, type OnGatewayInit } from '@nestjs/websockets';
import type { Subscription } from 'rxjs';
import type { Namespace, Socket } from 'socket.io';
import {
  LIVE_EVENTS,
  NAMESPACES,
  runRoom,
  type ConnectRefusal,
  type JoinReply,
  type LeaveReply,
  type LiveExclusionEvent,
  type LiveReadingsEvent,
} from '@kilocycle/common/events';
import type { AuthUser } from '../auth/auth-user.js';
import { AuthService } from '../auth/auth.service.js';
import { toRefusal } from '../ingest/ingest.exception.js';
import { ReadingsWriter } from '../readings/readings-writer.service.js';
import { LiveService } from './live.service.js';

type LiveSocketData = { user: AuthUser; token: string };
type LiveSocket = Socket<Record<string, never>, Record<string, never>, Record<string, never>, LiveSocketData>;

/**
 * `/live`: browsers authenticate with the session's JWT and join the room of each run they show;
 * every batch the write path commits (bridge, bench page or import) and every exclusion is pushed to
 * that run's room.
 */
@WebSocketGateway({ namespace: NAMESPACES.live })
export class LiveGateway implements OnGatewayInit, OnModuleDestroy {
  private readonly logger = new Logger('LiveGateway');
  private readonly subscriptions: Subscription[] = [];

  constructor(
    private readonly auth: AuthService,
    private readonly live: LiveService,
    private readonly writer: ReadingsWriter,
  ) {}

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
    // Fan-out after the commit: one encode per batch, whatever the number of watchers.
    this.subscriptions.push(
      this.writer.stored$.subscribe(({ runId, author, readings }) => {
        // socket.io encodes a broadcast even for an empty room: skip runs nobody is watching.
        if (!nsp.adapter.rooms.get(runRoom(runId))?.size) return;
        const event: LiveReadingsEvent = { runId, author, readings };
        nsp.to(runRoom(runId)).emit(LIVE_EVENTS.readings, event);
      }),
      this.writer.excluded$.subscribe(({ runId, reading }) => {
        if (!nsp.adapter.rooms.get(runRoom(runId))?.size) return;
        const event: LiveExclusionEvent = { runId, reading };
        nsp.to(runRoom(runId)).emit(LIVE_EVENTS.excluded, event);
      }),
    );
  }

  onModuleDestroy(): void {
    for (const subscription of this.subscriptions) subscription.unsubscribe();
  }

  @SubscribeMessage(LIVE_EVENTS.join)
  async join(@ConnectedSocket() socket: LiveSocket, @MessageBody() payload: unknown): Promise<JoinReply> {
    try {
      // Checked again at each join, so a deactivated or signed-out user stops at once.
      const user = await this.auth.authenticate(socket.data.token);
      socket.data.user = user;
      const { runId, lastSeq } = await this.live.runFor(user, payload);
      await socket.join(runRoom(runId));
      return { ok: true, runId, lastSeq };
    } catch (error) {
      if (error instanceof UnauthorizedException) {
        setImmediate(() => socket.disconnect(true));
        return { ok: false, code: 'forbidden', error: error.message };
      }
      const refusal = toRefusal(error);
      if (refusal.code === 'server_error') this.logger.warn(`join failed: ${refusal.error}`);
      return refusal;
    }
  }

  @SubscribeMessage(LIVE_EVENTS.leave)
  async leave(@ConnectedSocket() socket: LiveSocket, @MessageBody() payload: unknown): Promise<LeaveReply> {
    const runId = payload !== null && typeof payload === 'object' ? (payload as { runId?: unknown }).runId : undefined;
    if (typeof runId !== 'number' || !Number.isInteger(runId)) return { ok: false, code: 'bad_request', error: 'runId must be a whole number (the id of a run)' };
    await socket.leave(runRoom(runId));
    return { ok: true, runId };
  }
}
