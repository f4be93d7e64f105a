import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { ReadingSeries, ReservoirStatus } from '@stillwell/shared/telemetry';
import { Permission } from '../common/decorators/permission.decorator';
import { QuarantineQueryDto, ReadingsQueryDto } from './dto/readings-query.dto';
import { IngestionService, type IngestionCounters } from './ingestion.service';
import { QuarantinedMessage } from './quarantined-message.entity';
import { ReadingsService } from './readings.service';
import { SequenceGap } from './sequence-gap.entity';
import { StatusService } from './status.service';

@ApiTags('telemetry')
@Controller()
export class TelemetryController {
  constructor(
    private readonly readings: ReadingsService,
    private readonly status: StatusService,
    private readonly ingestion: IngestionService,
  ) {}

  @Get('reservoirs/:id/status')
  @Permission('telemetry.read')
  @ApiOkResponse({
    description: 'Latest value of every channel, pool, freeboard, rate of rise, site clock',
  })
  getStatus(@Param('id') id: string): ReservoirStatus {
    return this.status.status(id);
  }

  @Get('reservoirs/:id/channels/:channel/readings')
  @Permission('telemetry.read')
  @ApiOkResponse({ description: 'A channel readings over a time range (columnar, SI units)' })
  getReadings(
    @Param('id') id: string,
    @Param('channel') channel: string,
    @Query() query: ReadingsQueryDto,
  ): Promise<ReadingSeries> {
    return this.readings.series(id, channel, query);
  }

  @Get('reservoirs/:id/gaps')
  @Permission('telemetry.read')
  @ApiOkResponse({ description: 'Sequence gaps detected per device, most recent first' })
  getGaps(@Param('id') id: string): Promise<SequenceGap[]> {
    return this.readings.gapsOf(id);
  }

  @Get('telemetry/quarantine')
  @Permission('telemetry.read')
  @ApiOkResponse({
    description: 'Most recent quarantined messages with their reasons and raw payloads',
  })
  getQuarantine(@Query() query: QuarantineQueryDto): Promise<QuarantinedMessage[]> {
    return this.readings.recentQuarantine(query.limit);
  }

  @Get('telemetry/counters')
  @Permission('telemetry.read')
  @ApiOkResponse({ description: 'Ingestion counters since the gateway started' })
  getCounters(): IngestionCounters {
    return this.ingestion.counters;
  }
}
