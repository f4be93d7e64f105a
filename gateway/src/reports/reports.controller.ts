import {
  BadRequestException,
  Body,
  Controller,
  Get,
  HttpCode,
  NotFoundException,
  Param,
  Post,
  Query,
  Res,
} from '@nestjs/common';
import { ApiAcceptedResponse, ApiOkResponse, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { z } from 'zod';
import {
  createReportRequestSchema,
  REPORT_FORMATS,
  type ReportJob,
  type ReportWindow,
} from '@stillwell/shared/reports';
import type { Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { ZodApiBody } from '../orders/api-doc';
import { ReservoirsService } from '../reservoirs/reservoirs.service';
import { ReportBuilder } from './report-builder.service';
import { ReportJobs } from './report-jobs.service';
import { ZodPipe } from './report-request.pipe';

const resultQuerySchema = z.strictObject({ format: z.enum(REPORT_FORMATS) });
const MEDIA: Record<(typeof REPORT_FORMATS)[number], string> = {
  pdf: 'application/pdf',
  json: 'application/json; charset=utf-8',
  csv: 'text/csv; charset=utf-8',
};
/** The demo storm lasts 72 hours of plant time (simulator/src/scenarios/demo-storm.ts). */
const DEMO_STORM_MS = 72 * 3_600_000;

@ApiTags('reports')
@Controller('reservoirs/:reservoirId/reports')
export class ReportsController {
  constructor(
    private readonly jobs: ReportJobs,
    private readonly reservoirs: ReservoirsService,
    private readonly builder: ReportBuilder,
  ) {}

  /** An unknown reservoir is a bad request naming the field (the path is part of the request). */
  private reservoir(reservoirId: string) {
    const found = this.reservoirs.find(reservoirId);
    if (!found) throw new BadRequestException(`reservoirId: no reservoir "${reservoirId}"`);
    return found;
  }

  @Post()
  @HttpCode(202)
  @Permission('reports.create')
  @ZodApiBody(createReportRequestSchema, 'The window (ISO times) and the formats to build')
  @ApiAcceptedResponse({ description: 'The job (ReportJob): poll it, then download the result' })
  create(
    @Param('reservoirId') reservoirId: string,
    @Body() body: unknown,
    @CurrentPrincipal() p: Principal,
  ): ReportJob {
    this.reservoir(reservoirId);
    const req = new ZodPipe(createReportRequestSchema).transform(body);
    return this.jobs.create(
      reservoirId,
      { from: Date.parse(req.from), to: Date.parse(req.to), formats: req.formats },
      p.userId,
    );
  }

  @Get('demo-window')
  @Permission('reports.create')
  @ApiOkResponse({
    description: 'The demo storm: from the first stored pool reading, 72 h or to the last',
  })
  demoWindow(@Param('reservoirId') reservoirId: string): ReportWindow {
    const { definition } = this.reservoir(reservoirId);
    const source = this.builder.openReadings();
    try {
      const span = source.span(reservoirId, definition.poolChannels[0]!);
      if (!span) throw new NotFoundException('No pool readings stored yet: start the simulator');
      const to = Math.min(span.first + DEMO_STORM_MS, span.last + 1);
      return { from: new Date(span.first).toISOString(), to: new Date(to).toISOString() };
    } finally {
      source.close();
    }
  }

  @Get(':id')
  @Permission('reports.create')
  @ApiOkResponse({ description: 'The job: stage, percent, rows written (ReportJob)' })
  job(
    @Param('reservoirId') reservoirId: string,
    @Param('id') id: string,
    @CurrentPrincipal() p: Principal,
  ): ReportJob {
    this.reservoir(reservoirId);
    return this.jobs.get(reservoirId, id, p.userId);
  }

  @Get(':id/result')
  @Permission('reports.create')
  @ApiProduces('application/pdf', 'application/json', 'text/csv')
  @ApiOkResponse({ description: 'The finished report as a download (?format=pdf|json|csv)' })
  result(
    @Param('reservoirId') reservoirId: string,
    @Param('id') id: string,
    @Query() query: unknown,
    @CurrentPrincipal() p: Principal,
    @Res() res: Response,
  ): void {
    this.reservoir(reservoirId);
    const { format } = new ZodPipe(resultQuerySchema).transform(query);
    const file = this.jobs.result(reservoirId, id, p.userId, format);
    if (!file)
      throw new NotFoundException(
        `format: the job has no ${format} result (not asked for, or not done)`,
      );
    res.setHeader('Content-Type', MEDIA[format]);
    res.setHeader('Content-Disposition', `attachment; filename="${file.name}"`);
    res.setHeader('X-Content-Type-Options', 'nosniff');
    // streamed from disk: a large CSV never sits in memory
    res.sendFile(file.path, { dotfiles: 'allow' });
  }
}
