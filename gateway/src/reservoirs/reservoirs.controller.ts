import { Controller, Get, Param } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import type { ReservoirSummary } from '@stillwell/shared/telemetry';
import { ReservoirsService } from './reservoirs.service';

@ApiTags('reservoirs')
@Controller('reservoirs')
export class ReservoirsController {
  constructor(private readonly reservoirs: ReservoirsService) {}

  @Get()
  @ApiOkResponse({ description: 'Every reservoir this gateway serves' })
  list(): ReservoirSummary[] {
    return this.reservoirs.list();
  }

  @Get(':id')
  @ApiOkResponse({ description: 'The reservoir definition in force, with its version' })
  get(@Param('id') id: string): { version: number; definition: ReservoirDefinition } {
    const { version, definition } = this.reservoirs.get(id);
    return { version, definition };
  }
}
