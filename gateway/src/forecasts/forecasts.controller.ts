import {
  BadRequestException,
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  ParseIntPipe,
  Post,
  Query,
} from '@nestjs/common';
import { ApiBadRequestResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  FORECAST_CAUTION,
  type CompareResponse,
  type ForecastRun,
  type ForecastRunList,
  type ForecastUpdate,
  type WhatIfResponse,
} from '@stillwell/shared/forecasts';
import { SiteClockService } from '../clock/site-clock.service';
import { Permission } from '../common/decorators/permission.decorator';
import { ForecastRunsQueryDto } from './dto/forecast-query.dto';
import { CompareRequestDto, WhatIfRequestDto } from './dto/what-if.dto';
import { ForecastsService } from './forecasts.service';
import { WhatIfService } from './what-if.service';

/** Said in the API document beside every forecast route. */
const SUPPORT = FORECAST_CAUTION;
const DEFAULT_RANGE_MS = 6 * 3600_000;

@ApiTags('forecasts')
@Controller('reservoirs/:id/forecasts')
export class ForecastsController {
  constructor(
    private readonly forecasts: ForecastsService,
    private readonly whatIf: WhatIfService,
    private readonly clock: SiteClockService,
  ) {}

  @Get('latest')
  @Permission('forecast.read')
  @ApiOperation({
    summary: 'The latest live forecast',
    description: `Pool band (p10/p50/p90), peak, time to each threshold, time left to act and the smallest opening that holds the target now; with the reason when the last attempt failed. ${SUPPORT}`,
  })
  @ApiOkResponse({
    description: 'A ForecastUpdate: { reservoirId, run | null, problem | null, caution }',
  })
  latest(@Param('id') id: string): Promise<ForecastUpdate> {
    return this.forecasts.latestUpdate(id);
  }

  @Get()
  @Permission('forecast.read')
  @ApiOperation({
    summary: 'Stored forecast runs in a range of site time (summaries)',
    description: `Every run is stored as it was pushed, so a reviewer can see what operators saw at each moment. ${SUPPORT}`,
  })
  list(@Param('id') id: string, @Query() q: ForecastRunsQueryDto): Promise<ForecastRunList> {
    const to = q.to ? Date.parse(q.to) : this.clock.now(id);
    const from = q.from ? Date.parse(q.from) : to - DEFAULT_RANGE_MS;
    if (from > to)
      throw new BadRequestException([`from (${q.from}) is after to (${q.to ?? 'now'})`]);
    return this.forecasts.list(id, from, to, q.limit ?? 500);
  }

  @Get(':runId')
  @Permission('forecast.read')
  @ApiOperation({
    summary: 'One stored forecast run: inputs, versions, outputs and decisions',
    description: SUPPORT,
  })
  get(@Param('id') id: string, @Param('runId', ParseIntPipe) runId: number): Promise<ForecastRun> {
    return this.forecasts.get(id, runId);
  }

  @Post('what-if')
  @HttpCode(200)
  @Permission('forecast.run')
  @ApiOperation({
    summary: 'Route an inflow hydrograph under a gate schedule',
    description: `Returns the routed pool elevation and outflow and a summary (peak, time of peak, time above each threshold). Nothing is stored. ${SUPPORT}`,
  })
  @ApiBadRequestResponse({
    description:
      'A table is refused: every problem names the field and the row ("inflow row 4 (t): must be after row 3 (3600 s)")',
  })
  route(@Param('id') id: string, @Body() body: WhatIfRequestDto): WhatIfResponse {
    return this.whatIf.route(id, body);
  }

  @Post('compare')
  @HttpCode(200)
  @Permission('forecast.run')
  @ApiOperation({
    summary: 'Two gate schedules on the same inflow, side by side',
    description: `For example "open now" against "open in 3 hours": peaks, times, time above each threshold, and the differences (b minus a). ${SUPPORT}`,
  })
  @ApiBadRequestResponse({ description: 'A table is refused, naming the field and the row' })
  compare(@Param('id') id: string, @Body() body: CompareRequestDto): CompareResponse {
    return this.whatIf.compare(id, body);
  }
}
