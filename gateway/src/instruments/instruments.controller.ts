import { Controller, Get, Param, Query } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { DamSafety } from '@stillwell/shared/alarms';
import { Permission } from '../common/decorators/permission.decorator';
import { DamSafetyQueryDto } from './dto/dam-safety.dto';
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
}
