import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsIn, IsNumber, IsOptional, IsString, Length, Max, MaxLength, Min } from 'class-validator';
import {
  WHAT_IF_LIMITS,
  type FlowRow,
  type OpeningRow,
  type ScheduleRow,
} from '@stillwell/shared/forecasts';
import { IsFlowTable, IsOpeningTable, IsScheduleTable } from './table-validators';

const rows = (description: string, example: unknown[]) => ({
  description,
  type: 'array' as const,
  items: { type: 'object' as const },
  example,
});

/** The inflow, start state and grid of a what-if or a comparison (times: s from the start). */
export class WhatIfBaseDto {
  @ApiPropertyOptional(
    rows('Inflow hydrograph rows { t: s from the start, q: m3/s }; give this or inflowCsv', [
      { t: 0, q: 400 },
      { t: 21600, q: 1800 },
      { t: 86400, q: 200 },
    ]),
  )
  @IsOptional()
  @IsFlowTable()
  inflow?: FlowRow[];

  @ApiPropertyOptional({
    description:
      'Inflow hydrograph as CSV text: a header with a time column (time, t, hour, ...) and a flow column (flow, q, inflow, ...); times in inflowTimeUnit or ISO 8601 date-times with an offset',
    example: 'time,flow\n0,400\n6,1800\n24,200',
  })
  @IsOptional()
  @IsString()
  @MaxLength(WHAT_IF_LIMITS.csvChars)
  inflowCsv?: string;

  @ApiPropertyOptional({
    enum: ['s', 'min', 'h'],
    description: 'unit of numeric CSV times (default s)',
  })
  @IsOptional()
  @IsIn(['s', 'min', 'h'])
  inflowTimeUnit?: 's' | 'min' | 'h';

  @ApiPropertyOptional({
    description: 'pool elevation at the start, m (default: the current pool)',
  })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  startElevation?: number;

  @ApiPropertyOptional(
    rows('openings at the start (default: as reported now); a gate or valve not listed is closed', [
      { id: 'gate-1', opening: 0 },
    ]),
  )
  @IsOptional()
  @IsOpeningTable()
  initialOpenings?: OpeningRow[];

  @ApiPropertyOptional({
    description: 'length of the run, s (default: the hydrograph, at least 24 h)',
  })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(WHAT_IF_LIMITS.minDurationS)
  @Max(WHAT_IF_LIMITS.maxDurationS)
  durationS?: number;

  @ApiPropertyOptional({ description: 'routing step, s (default 60)' })
  @IsOptional()
  @IsNumber({ allowNaN: false, allowInfinity: false })
  @Min(WHAT_IF_LIMITS.minDtS)
  @Max(WHAT_IF_LIMITS.maxDtS)
  dtS?: number;
}

const scheduleExample = [
  { time: 0, id: 'gate-1', target: 4 },
  { time: 0, id: 'gate-2', target: 4 },
];

export class WhatIfRequestDto extends WhatIfBaseDto {
  @ApiProperty(
    rows(
      'gate schedule rows { time: s from the start, id: gate or valve, target: m or % }',
      scheduleExample,
    ),
  )
  @IsScheduleTable()
  schedule: ScheduleRow[];
}

export class CompareRequestDto extends WhatIfBaseDto {
  @ApiProperty({ example: 'Open now' })
  @IsString()
  @Length(1, 80)
  labelA: string;

  @ApiProperty(rows('schedule A', scheduleExample))
  @IsScheduleTable()
  scheduleA: ScheduleRow[];

  @ApiProperty({ example: 'Open in 3 hours' })
  @IsString()
  @Length(1, 80)
  labelB: string;

  @ApiProperty(
    rows(
      'schedule B',
      scheduleExample.map((e) => ({ ...e, time: 10800 })),
    ),
  )
  @IsScheduleTable()
  scheduleB: ScheduleRow[];
}
