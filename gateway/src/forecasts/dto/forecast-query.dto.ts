import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsISO8601, IsInt, IsOptional, Max, Min } from 'class-validator';
import { RUN_LIST_LIMIT } from '../forecasts.service';

export class ForecastRunsQueryDto {
  @ApiPropertyOptional({
    description: 'start of the range, ISO 8601 site time (default: 6 h before `to`)',
  })
  @IsOptional()
  @IsISO8601({ strict: true })
  from?: string;

  @ApiPropertyOptional({
    description: 'end of the range, ISO 8601 site time (default: the site now)',
  })
  @IsOptional()
  @IsISO8601({ strict: true })
  to?: string;

  @ApiPropertyOptional({
    description: `most recent runs kept when the range holds more (1..${RUN_LIST_LIMIT})`,
  })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(RUN_LIST_LIMIT)
  limit?: number;
}
