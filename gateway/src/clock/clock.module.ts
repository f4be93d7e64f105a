import { Global, Module } from '@nestjs/common';
import { SiteClockService } from './site-clock.service';
import { MqttService } from '../mqtt/mqtt.service';

@Global()
@Module({
  providers: [
    {
      provide: SiteClockService,
      inject: [MqttService],
      useFactory: (mqtt: MqttService) => new SiteClockService(mqtt),
    },
  ],
  exports: [SiteClockService],
})
export class ClockModule {}
