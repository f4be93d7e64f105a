import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsArray,
  IsISO8601,
  IsNumber,
  IsObject,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
} from 'class-validator';

export class DamSafetyQueryDto {
  @ApiPropertyOptional({ description: 'ISO 8601, site time (default: `days` before to)' })
  @IsOptional()
  @IsISO8601()
  from?: string;

  @ApiPropertyOptional({ description: 'ISO 8601, site time (default: now)' })
  @IsOptional()
  @IsISO8601()
  to?: string;

  @ApiPropertyOptional({
    description: 'without from: this many days of site time before to (default 7)',
  })
  @IsOptional()
  @Type(() => Number)
  @IsNumber()
  @Min(0.01)
  @Max(366)
  days?: number;
}

/** Checked against the shared definition schema in the service; here only its outline. */
export class DamSafetyLimitsDto {
  @ApiPropertyOptional({
    description: 'The seepage weirs with their limits and baselines (replacing the current ones)',
    type: 'array',
    items: { type: 'object' },
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(50)
  seepageWeirs?: unknown[];

  @ApiPropertyOptional({
    description: 'The piezometers with their limits and baselines (replacing the current ones)',
    type: 'array',
    items: { type: 'object' },
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(200)
  piezometers?: unknown[];

  @ApiPropertyOptional({
    description: 'The alarm limits (the definition’s alarms section, replacing it)',
    type: 'object',
    additionalProperties: true,
  })
  @IsOptional()
  @IsObject()
  alarms?: Record<string, unknown>;

  @ApiPropertyOptional({
    description: 'why the limits change (kept with the version and in the logbook)',
  })
  @IsOptional()
  @IsString()
  @MaxLength(500)
  note?: string;
}
