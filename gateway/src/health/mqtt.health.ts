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
    return this.mqtt.connected
      ? check.up()
      : check.down({ message: 'not connected to the broker' });
  }
}
