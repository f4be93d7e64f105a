import { Controller, Get, Param, ParseIntPipe, Query } from '@nestjs/common';
import { ApiBadRequestResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  REPLAY_BUCKETS,
  REPLAY_FORECAST_CAUTION,
  type ReplayEntryPage,
  type ReplayEventList,
  type ReplayForecast,
  type ReplayWindow,
} from '@stillwell/shared/replay';
import { Permission } from '../common/decorators/permission.decorator';
import { ReplayEntriesQueryDto, ReplayWindowQueryDto } from './dto/replay-query.dto';
import { ReplayEntriesService } from './replay-entries.service';
import { ReplayEventsService } from './replay-events.service';
import { ReplayService } from './replay.service';

/** The record of a past window, served from what is stored (never by re-running anything). */
@ApiTags('replay')
@Controller('reservoirs/:reservoirId/replay')
export class ReplayController {
  constructor(
    private readonly replay: ReplayService,
    private readonly entries: ReplayEntriesService,
    private readonly events: ReplayEventsService,
  ) {}

  @Get('events')
  @Permission('replay.read')
  @ApiOperation({
    summary: 'Windows worth replaying',
    description:
      'Spells of the pool above the lowest alert threshold (padded by 6 h), emergencies from declaration to end, and the whole record; newest first.',
  })
  @ApiOkResponse({ description: 'A ReplayEventList' })
  listEvents(@Param('reservoirId') reservoirId: string): Promise<ReplayEventList> {
    return this.events.list(reservoirId, this.replay.maxWindowMs);
  }

  @Get('window')
  @Permission('replay.read')
  @ApiOperation({
    summary: 'Readings, alarm events and forecast runs of a window',
    description: `Each series is cut into equal time buckets (default ${REPLAY_BUCKETS.default}) keeping each bucket's minimum and maximum, so peaks survive; raw readings for short windows, one-minute aggregates for long ones (the response says which and why).`,
  })
  @ApiOkResponse({ description: 'A ReplayWindow' })
  @ApiBadRequestResponse({
    description: 'a field is missing or out of range; the message names it',
  })
  window(
    @Param('reservoirId') reservoirId: string,
    @Query() q: ReplayWindowQueryDto,
  ): Promise<ReplayWindow> {
    return this.replay.window(reservoirId, {
      fromMs: Date.parse(q.from),
      toMs: Date.parse(q.to),
      buckets: q.buckets ?? REPLAY_BUCKETS.default,
      channels: q.channels,
    });
  }

  @Get('entries')
  @Permission('replay.read')
  @ApiOperation({
    summary: 'Logbook entries of a window in site-time order, a page at a time',
    description:
      'Every logbook entry (orders, notices, alarms, shift notes, ...) placed at its site time: the one it records, or its wall time mapped through the readings (timeSource says which).',
  })
  @ApiOkResponse({ description: 'A ReplayEntryPage; follow `next` until it is null' })
  @ApiBadRequestResponse({
    description: 'a field is missing or out of range; the message names it',
  })
  listEntries(
    @Param('reservoirId') reservoirId: string,
    @Query() q: ReplayEntriesQueryDto,
  ): Promise<ReplayEntryPage> {
    const fromMs = Date.parse(q.from);
    const toMs = Date.parse(q.to);
    this.replay.checkWindow(fromMs, toMs);
    const [t, seq] = q.after ? q.after.split(':').map(Number) : [];
    const cursor = t !== undefined && seq !== undefined ? { t, seq } : null;
    return this.entries.page(reservoirId, fromMs, toMs, cursor, q.limit ?? 200);
  }

  @Get('forecast-runs/:runId')
  @Permission('replay.read')
  @ApiOperation({
    summary: 'The forecast band of one stored run, as operators saw it',
    description: REPLAY_FORECAST_CAUTION,
  })
  @ApiOkResponse({ description: 'A ReplayForecast' })
  forecast(
    @Param('reservoirId') reservoirId: string,
    @Param('runId', ParseIntPipe) runId: number,
  ): Promise<ReplayForecast> {
    return this.replay.forecast(reservoirId, runId);
  }
}
