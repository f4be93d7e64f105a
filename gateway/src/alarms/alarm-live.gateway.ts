import { Logger, OnModuleDestroy } from '@nestjs/common';
import {
  ConnectedSocket,
  MessageBody,
  OnGatewayInit,
  SubscribeMessage,
  WebSocketGateway,
  WebSocketServer,
} from '@nestjs/websockets';
import type { Subscription } from 'rxjs';
import type { Namespace, Socket } from 'socket.io';
import { ALARM_LIVE_EVENTS, type AlarmList } from '@stillwell/shared/alarms';
import { LIVE_NAMESPACE, type SubscribeAck } from '@stillwell/shared/telemetry';
import { joinReservoirRoom, leaveReservoirRoom, type ReservoirRoom } from '../auth/live-rooms';
import { LiveSocketAuth } from '../auth/live-socket-auth';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { AlarmStore } from './alarm-store.service';
import { AlarmViewsService } from './alarm-views.service';
import { coalescePerKey } from './coalesce';

/** A burst of changes (a storm raising several alarms at once) is one push per reservoir. */
export const ALARM_PUSH_COALESCE_MS = 250;

const alarmsRoom: ReservoirRoom = {
  action: 'alarms.read',
  room: (reservoirId) => `alarms:${reservoirId}`,
};

/**
 * The alarm list, live on the /live namespace (whose handshake check the telemetry LiveGateway
 * installs): the whole list at once on joining, and again after every change, so a console
 * never has to merge partial updates. Joining re-checks alarms.read.
 */
@WebSocketGateway({ namespace: LIVE_NAMESPACE })
export class AlarmLiveGateway implements OnGatewayInit, OnModuleDestroy {
  private readonly logger = new Logger(AlarmLiveGateway.name);
  private subscription?: Subscription;

  @WebSocketServer()
  private readonly server: Namespace;

  constructor(
    private readonly store: AlarmStore,
    private readonly views: AlarmViewsService,
    private readonly reservoirs: ReservoirsService,
    private readonly access: LiveSocketAuth,
  ) {}

  afterInit(): void {
    // the list is sent once at the end of each window, as it then stands
    this.subscription = coalescePerKey(this.store.changed$, ALARM_PUSH_COALESCE_MS).subscribe(
      (reservoirId) => {
        const list = this.listOf(reservoirId);
        // not local: the change was made on this gateway, the others' consoles need it too
        if (list) this.server.to(alarmsRoom.room(reservoirId)).emit(ALARM_LIVE_EVENTS.list, list);
      },
    );
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  @SubscribeMessage(ALARM_LIVE_EVENTS.subscribe)
  async subscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    const { ack, joined } = await joinReservoirRoom(
      this.access,
      this.reservoirs,
      alarmsRoom,
      socket,
      body,
    );
    if (!joined) return ack;
    // socket.io keeps nothing for a client that was away: the list as it stands, at once
    const list = this.listOf(joined);
    if (list) socket.emit(ALARM_LIVE_EVENTS.list, list);
    this.logger.debug(`${socket.id} follows the alarms of ${joined}`);
    return ack;
  }

  @SubscribeMessage(ALARM_LIVE_EVENTS.unsubscribe)
  async unsubscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    return leaveReservoirRoom(alarmsRoom, socket, body);
  }

  /** The list, or null while the alarms do not watch the reservoir (yet). */
  private listOf(reservoirId: string): AlarmList | null {
    try {
      return this.views.list(reservoirId);
    } catch (error) {
      this.logger.warn(`No alarm list for ${reservoirId}: ${String(error)}`);
      return null;
    }
  }
}
