import { Body, Controller, Get, HttpCode, Param, ParseIntPipe, Post } from '@nestjs/common';
import {
  ApiBadRequestResponse,
  ApiConflictResponse,
  ApiCreatedResponse,
  ApiOkResponse,
  ApiTags,
} from '@nestjs/swagger';
import {
  limitsChangeSchema,
  type LimitsChange,
  type LimitsChangeResult,
  type ReservoirDefinition,
} from '@stillwell/shared/reservoirs';
import type { ReservoirSummary } from '@stillwell/shared/telemetry';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RequiresStepUp } from '../common/decorators/requires-step-up.decorator';
import { ZodApiBody } from '../orders/api-doc';
import { DefinitionUploadService, type UploadResult } from './definition-upload.service';
import { StorageTableUploadDto, StructuresUploadDto } from './dto/definition-upload.dto';
import { LimitsChangePipe } from './limits-change.pipe';
import { LimitsChangeService } from './limits-change.service';
import { ReservoirsService, type VersionSummary } from './reservoirs.service';

@ApiTags('reservoirs')
@Controller('reservoirs')
export class ReservoirsController {
  constructor(
    private readonly reservoirs: ReservoirsService,
    private readonly uploads: DefinitionUploadService,
    private readonly limits: LimitsChangeService,
  ) {}

  @Get()
  @Permission('reservoir.read')
  @ApiOkResponse({ description: 'Every reservoir this gateway serves' })
  list(): ReservoirSummary[] {
    return this.reservoirs.list();
  }

  @Get(':id')
  @Permission('reservoir.read')
  @ApiOkResponse({ description: 'The reservoir definition in force, with its version' })
  get(@Param('id') id: string): { version: number; definition: ReservoirDefinition } {
    const { version, definition } = this.reservoirs.get(id);
    return { version, definition };
  }

  @Get(':id/versions')
  @Permission('reservoir.read')
  @ApiOkResponse({
    description: 'Every version of the definition, newest first: who wrote it, when, what changed',
  })
  versions(@Param('id') id: string): Promise<VersionSummary[]> {
    return this.reservoirs.listVersions(id);
  }

  @Get(':id/versions/:version')
  @Permission('reservoir.read')
  @ApiOkResponse({ description: 'One version of the definition as it was written' })
  version(
    @Param('id') id: string,
    @Param('version', ParseIntPipe) version: number,
  ): Promise<{ version: number; definition: ReservoirDefinition }> {
    return this.reservoirs.getVersion(id, version);
  }

  @Post(':id/definition/storage-table')
  @HttpCode(201)
  @Permission('reservoir.edit')
  @RequiresStepUp()
  @ApiCreatedResponse({
    description:
      'A new version with the uploaded elevation-area-storage table (CSV). Recorded in the logbook; forecasts rerun on it.',
  })
  @ApiBadRequestResponse({
    description:
      'The table is refused: each problem names the row and column ("storageTable row 4 (elevation): ...")',
  })
  @ApiConflictResponse({ description: 'Another change came first: load the definition again' })
  uploadStorageTable(
    @Param('id') id: string,
    @Body() body: StorageTableUploadDto,
    @CurrentPrincipal() principal: Principal,
  ): Promise<UploadResult> {
    return this.uploads.storageTable(id, body.csv, body.note ?? null, actorOf(principal));
  }

  @Post(':id/definition/structures')
  @HttpCode(201)
  @Permission('reservoir.edit')
  @RequiresStepUp()
  @ApiCreatedResponse({
    description:
      'A new version with the uploaded outflow structures and/or thresholds (JSON, checked against the shared schema). Recorded in the logbook.',
  })
  @ApiBadRequestResponse({
    description: 'Refused: each problem names its path ("structures[0].gates[1].width: ...")',
  })
  @ApiConflictResponse({ description: 'Another change came first: load the definition again' })
  uploadStructures(
    @Param('id') id: string,
    @Body() body: StructuresUploadDto,
    @CurrentPrincipal() principal: Principal,
  ): Promise<UploadResult> {
    return this.uploads.structures(
      id,
      { structures: body.structures, thresholds: body.thresholds },
      body.note ?? null,
      actorOf(principal),
    );
  }

  @Post(':id/definition/limits')
  @HttpCode(201)
  @Permission('limits.edit')
  @RequiresStepUp()
  @ZodApiBody(
    limitsChangeSchema,
    'baseVersion, note, and any of: alarm limit sections, alert levels, seepage-weir and piezometer limits and baselines',
  )
  @ApiCreatedResponse({
    description:
      'A new version with the changed limits; the answer and the logbook entry list every field from/to. The alarms judge by it at once.',
  })
  @ApiBadRequestResponse({
    description:
      'Refused: each problem names its field ("seepageWeirs[0].maxFlow: ..."); nothing is stored',
  })
  @ApiConflictResponse({
    description: 'baseVersion is not the version in force: load the definition again',
  })
  changeLimits(
    @Param('id') id: string,
    @Body(new LimitsChangePipe()) body: LimitsChange,
    @CurrentPrincipal() principal: Principal,
  ): Promise<LimitsChangeResult> {
    return this.limits.change(id, body, actorOf(principal));
  }
}
