import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsISO8601, IsInt, IsOptional, Max, Min } from 'class-validator';

export const MAX_READINGS = 100_000;

export class ReadingsQueryDto {
  @ApiPropertyOptional({
    description: 'start of the range, ISO 8601 (default: 6 hours before `to`)',
  })
  @IsOptional()
  @IsISO8601({ strict: true })
  from?: string;

  @ApiPropertyOptional({ description: 'end of the range, ISO 8601 (default: the site clock now)' })
  @IsOptional()
  @IsISO8601({ strict: true })
  to?: string;

  @ApiPropertyOptional({
    description: `most recent readings kept when the range holds more (1..${MAX_READINGS})`,
  })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(MAX_READINGS)
  limit?: number;
}

export class QuarantineQueryDto {
  @ApiPropertyOptional({
    description: 'how many of the most recent quarantined messages (1..1000)',
  })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(1000)
  limit?: number;
}
