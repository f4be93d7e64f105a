import { Injectable } from '@nestjs/common';
import { HealthIndicatorService } from '@nestjs/terminus';
import { MqttService } from '../mqtt/mqtt.service';

@Injectable()
export class MqttHealthIndicator {
  constructor(
    private readonly mqtt: MqttService,
    private readonly indicator: HealthIndicatorService,
  ) {}

  check(key: string) {
    const check = this.indicator.check(key);
    if (this.mqtt.ready) return check.up();
    return check.down({
      message: this.mqtt.connected
        ? 'connected, waiting for the broker to confirm the subscriptions'
        : 'not connected to the broker',
    });
  }
}
