import { Body, Controller, Get, HttpCode, Param, Post, Query } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type {
  AlarmConditionList,
  AlarmEventList,
  AlarmHistory,
  AlarmList,
  AlarmPerformance,
  AlarmView,
} from '@stillwell/shared/alarms';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { AlarmViewsService } from './alarm-views.service';
import { AlarmsService } from './alarms.service';
import {
  AcknowledgeDto,
  OutOfServiceDto,
  ReturnToServiceDto,
  ShelveDto,
} from './dto/alarm-action.dto';
import { AlarmRangeDto, PerformanceQueryDto } from './dto/alarm-query.dto';

const REFUSED_400 =
  'Refused: a reason is required, or the shelf ends in the past or too far ahead (code)';
const REFUSED_409 =
  'Refused: the alarm is not in a state that allows it (code: already-acknowledged, not-in-service, already-in-service)';

@ApiTags('alarms')
@Controller('reservoirs/:id/alarms')
export class AlarmsController {
  constructor(
    private readonly alarms: AlarmsService,
    private readonly views: AlarmViewsService,
  ) {}

  @Get()
  @Permission('alarms.read')
  @ApiOkResponse({
    description:
      'The alarms not at rest (active, unacknowledged, shelved, out of service): unacknowledged first, then by priority, then the newest; with counts by priority',
  })
  list(@Param('id') id: string): AlarmList {
    return this.views.list(id);
  }

  @Get('conditions')
  @Permission('alarms.read')
  @ApiOkResponse({
    description: 'Every alarm condition of the reservoir with its limits (from the definition)',
  })
  conditions(@Param('id') id: string): AlarmConditionList {
    const { version, list } = this.alarms.conditions(id);
    return { definitionVersion: version, conditions: [...list] };
  }

  @Get('events')
  @Permission('alarms.read')
  @ApiOkResponse({ description: 'Raises, clears and actions over a site-time range, newest first' })
  events(@Param('id') id: string, @Query() q: AlarmRangeDto): Promise<AlarmEventList> {
    return this.views.events(id, q);
  }

  @Get('performance')
  @Permission('alarms.read')
  @ApiOkResponse({
    description:
      'Alarm rates per operator per 10 minutes, floods (10+ in 10 min), most frequent and chattering alarms (ISA-18.2 / EEMUA 191 benchmarks)',
  })
  performance(@Param('id') id: string, @Query() q: PerformanceQueryDto): Promise<AlarmPerformance> {
    return this.views.performance(id, q);
  }

  @Get(':conditionId/history')
  @Permission('alarms.read')
  @ApiOkResponse({
    description: 'One alarm: its condition, its state and its history, newest first',
  })
  history(
    @Param('id') id: string,
    @Param('conditionId') conditionId: string,
  ): Promise<AlarmHistory> {
    return this.views.history(id, conditionId);
  }

  @Post(':conditionId/acknowledge')
  @HttpCode(200)
  @Permission('alarms.acknowledge')
  @ApiOkResponse({ description: 'Acknowledged (optional comment); recorded in the logbook' })
  @ApiConflictResponse({ description: REFUSED_409 })
  acknowledge(
    @Param('id') id: string,
    @Param('conditionId') conditionId: string,
    @Body() body: AcknowledgeDto,
    @CurrentPrincipal() principal: Principal,
  ): Promise<AlarmView> {
    return this.views.act(
      id,
      conditionId,
      { type: 'acknowledge', comment: body.comment },
      actorOf(principal),
    );
  }

  @Post(':conditionId/shelve')
  @HttpCode(200)
  @Permission('alarms.shelve')
  @ApiOkResponse({
    description: 'Shelved for durationS of site time, with a reason; recorded in the logbook',
  })
  @ApiBadRequestResponse({ description: REFUSED_400 })
  @ApiConflictResponse({ description: REFUSED_409 })
  shelve(
    @Param('id') id: string,
    @Param('conditionId') conditionId: string,
    @Body() body: ShelveDto,
    @CurrentPrincipal() principal: Principal,
  ): Promise<AlarmView> {
    return this.views.act(
      id,
      conditionId,
      { type: 'shelve-for', reason: body.reason, durationS: body.durationS },
      actorOf(principal),
    );
  }

  @Post(':conditionId/out-of-service')
  @HttpCode(200)
  @Permission('alarms.shelve')
  @ApiOkResponse({ description: 'Taken out of service, with a reason; recorded in the logbook' })
  @ApiBadRequestResponse({ description: REFUSED_400 })
  @ApiConflictResponse({ description: REFUSED_409 })
  outOfService(
    @Param('id') id: string,
    @Param('conditionId') conditionId: string,
    @Body() body: OutOfServiceDto,
    @CurrentPrincipal() principal: Principal,
  ): Promise<AlarmView> {
    return this.views.act(
      id,
      conditionId,
      { type: 'remove-from-service', reason: body.reason },
      actorOf(principal),
    );
  }

  @Post(':conditionId/return-to-service')
  @HttpCode(200)
  @Permission('alarms.shelve')
  @ApiOkResponse({
    description: 'Back in service from a shelf or out of service; recorded in the logbook',
  })
  @ApiConflictResponse({ description: REFUSED_409 })
  returnToService(
    @Param('id') id: string,
    @Param('conditionId') conditionId: string,
    @Body() body: ReturnToServiceDto,
    @CurrentPrincipal() principal: Principal,
  ): Promise<AlarmView> {
    return this.views.act(
      id,
      conditionId,
      { type: 'return-to-service', comment: body.comment },
      actorOf(principal),
    );
  }
}
