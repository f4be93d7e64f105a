import { Body, Controller, Get, HttpCode, Param, Post, Query } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import type { DamSafety } from '@stillwell/shared/alarms';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RequiresStepUp } from '../common/decorators/requires-step-up.decorator';
import { DamSafetyLimitsDto, DamSafetyQueryDto } from './dto/dam-safety.dto';
import { InstrumentsService } from './instruments.service';

@ApiTags('dam safety')
@Controller('reservoirs/:id')
export class InstrumentsController {
  constructor(private readonly instruments: InstrumentsService) {}

  @Get('dam-safety')
  @Permission('telemetry.read')
  @ApiOkResponse({
    description:
      'Seepage (from weir head by the V-notch equation) and piezometric levels with the pool at each reading, their limits and baselines, and the latest water balance',
  })
  damSafety(@Param('id') id: string, @Query() q: DamSafetyQueryDto): Promise<DamSafety> {
    return this.instruments.damSafety(id, q);
  }

  @Post('definition/dam-safety')
  @HttpCode(201)
  @Permission('reservoir.edit')
  @RequiresStepUp()
  @ApiCreatedResponse({
    description:
      'A new version of the definition with the given seepage weirs, piezometers and/or alarm limits (their thresholds and baselines). Recorded in the logbook.',
  })
  @ApiBadRequestResponse({
    description: 'Refused: each problem names its path ("seepageWeirs[0].maxFlow: ...")',
  })
  @ApiConflictResponse({ description: 'Another change came first: load the definition again' })
  changeLimits(
    @Param('id') id: string,
    @Body() body: DamSafetyLimitsDto,
    @CurrentPrincipal() principal: Principal,
  ) {
    const { note, ...change } = body;
    return this.instruments.changeLimits(id, change, note ?? null, actorOf(principal));
  }
}
