import { Logger, OnModuleDestroy } from '@nestjs/common';
import {
  ConnectedSocket,
  MessageBody,
  OnGatewayInit,
  SubscribeMessage,
  WebSocketGateway,
  WebSocketServer,
} from '@nestjs/websockets';
import type { Namespace, Socket } from 'socket.io';
import type { Subscription } from 'rxjs';
import { ORDER_LIVE_EVENTS } from '@stillwell/shared/orders';
import { LIVE_NAMESPACE, type SubscribeAck } from '@stillwell/shared/telemetry';
import { joinReservoirRoom, leaveReservoirRoom, type ReservoirRoom } from '../auth/live-rooms';
import { LiveSocketAuth } from '../auth/live-socket-auth';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { EmergencyService } from './emergency.service';
import { OrderEvents } from './order-events';

const ordersRoom: ReservoirRoom = {
  action: 'orders.read',
  room: (reservoirId) => `orders:${reservoirId}`,
};

/**
 * Orders, emergencies, automatic rules and order alarms, live on the /live namespace (whose
 * handshake check the telemetry LiveGateway installs). Joining re-checks orders.read.
 */
@WebSocketGateway({ namespace: LIVE_NAMESPACE })
export class OrdersLiveGateway implements OnGatewayInit, OnModuleDestroy {
  private readonly logger = new Logger(OrdersLiveGateway.name);
  private subscription?: Subscription;

  @WebSocketServer()
  private readonly server: Namespace;

  constructor(
    private readonly events: OrderEvents,
    private readonly emergencies: EmergencyService,
    private readonly reservoirs: ReservoirsService,
    private readonly access: LiveSocketAuth,
  ) {}

  afterInit(): void {
    this.subscription = this.events.events$.subscribe((e) => {
      const to = this.server.to(ordersRoom.room(e.reservoirId));
      if (e.kind === 'order') to.emit(ORDER_LIVE_EVENTS.order, e.order);
      else if (e.kind === 'emergency') to.emit(ORDER_LIVE_EVENTS.emergency, e.emergency);
      else if (e.kind === 'automation') to.emit(ORDER_LIVE_EVENTS.automation, e.rule);
      else to.emit(ORDER_LIVE_EVENTS.alarm, e.alarm);
    });
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  @SubscribeMessage(ORDER_LIVE_EVENTS.subscribe)
  async subscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    const { ack, joined } = await joinReservoirRoom(
      this.access,
      this.reservoirs,
      ordersRoom,
      socket,
      body,
    );
    if (!joined) return ack;
    // socket.io keeps nothing for a client that was away: the emergency state at once
    socket.emit(ORDER_LIVE_EVENTS.emergency, await this.emergencies.current(joined));
    this.logger.debug(`${socket.id} follows the orders of ${joined}`);
    return ack;
  }

  @SubscribeMessage(ORDER_LIVE_EVENTS.unsubscribe)
  async unsubscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    return leaveReservoirRoom(ordersRoom, socket, body);
  }
}
