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
import { FORECAST_LIVE_EVENTS } from '@stillwell/shared/forecasts';
import { LIVE_NAMESPACE, type SubscribeAck } from '@stillwell/shared/telemetry';
import { joinReservoirRoom, leaveReservoirRoom, type ReservoirRoom } from '../auth/live-rooms';
import { LiveSocketAuth } from '../auth/live-socket-auth';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ForecastsService } from './forecasts.service';

const forecastRoom: ReservoirRoom = {
  action: 'forecast.read',
  room: (reservoirId) => `forecast:${reservoirId}`,
};

/**
 * Live forecasts on the /live namespace. A room of their own, apart from the reservoir's telemetry
 * room, because the matrix gives forecasts to fewer roles than telemetry (an administrator sees
 * readings but not forecasts): joining checks 'forecast.read'. The namespace's handshake check is
 * installed once, by the telemetry LiveGateway, and covers these sockets too.
 */
@WebSocketGateway({ namespace: LIVE_NAMESPACE })
export class ForecastLiveGateway implements OnGatewayInit, OnModuleDestroy {
  private readonly logger = new Logger(ForecastLiveGateway.name);
  private subscription?: Subscription;

  @WebSocketServer()
  private readonly server: Namespace;

  constructor(
    private readonly forecasts: ForecastsService,
    private readonly reservoirs: ReservoirsService,
    private readonly access: LiveSocketAuth,
  ) {}

  afterInit(): void {
    this.subscription = this.forecasts.updates$.subscribe((update) =>
      this.server
        .to(forecastRoom.room(update.reservoirId))
        .emit(FORECAST_LIVE_EVENTS.forecast, update),
    );
  }

  onModuleDestroy(): void {
    this.subscription?.unsubscribe();
  }

  @SubscribeMessage(FORECAST_LIVE_EVENTS.subscribe)
  async subscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    const { ack, joined } = await joinReservoirRoom(
      this.access,
      this.reservoirs,
      forecastRoom,
      socket,
      body,
    );
    if (!joined) return ack;
    // socket.io keeps nothing for a client that was away: the latest run at once
    socket.emit(FORECAST_LIVE_EVENTS.forecast, await this.forecasts.latestUpdate(joined));
    this.logger.debug(`${socket.id} follows the forecast of ${joined}`);
    return ack;
  }

  @SubscribeMessage(FORECAST_LIVE_EVENTS.unsubscribe)
  async unsubscribe(
    @ConnectedSocket() socket: Socket,
    @MessageBody() body: unknown,
  ): Promise<SubscribeAck> {
    return leaveReservoirRoom(forecastRoom, socket, body);
  }
}
