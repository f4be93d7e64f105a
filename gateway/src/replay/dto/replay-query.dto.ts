import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import {
  ArrayMaxSize,
  IsISO8601,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  Min,
} from 'class-validator';
import { REPLAY_BUCKETS } from '@stillwell/shared/replay';

export class ReplayRangeDto {
  @ApiProperty({ description: 'start of the window, ISO 8601 (site time)' })
  @IsISO8601({ strict: true })
  from: string;

  @ApiProperty({ description: 'end of the window, ISO 8601 (site time); after `from`' })
  @IsISO8601({ strict: true })
  to: string;
}

export class ReplayWindowQueryDto extends ReplayRangeDto {
  @ApiPropertyOptional({
    description: `time buckets per series (${REPLAY_BUCKETS.min}..${REPLAY_BUCKETS.max}, default ${REPLAY_BUCKETS.default}); each keeps its minimum and maximum, so at most twice as many points`,
  })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(REPLAY_BUCKETS.min)
  @Max(REPLAY_BUCKETS.max)
  buckets?: number;

  @ApiPropertyOptional({
    description:
      'channel ids, comma-separated (default: pool, inflow, outflow, gate and valve openings)',
  })
  @IsOptional()
  @Transform(({ value }: { value: unknown }) =>
    typeof value === 'string' ? value.split(',').filter(Boolean) : value,
  )
  @IsString({ each: true })
  @ArrayMaxSize(50)
  channels?: string[];
}

export const ENTRY_PAGE_MAX = 1000;

export class ReplayEntriesQueryDto extends ReplayRangeDto {
  @ApiPropertyOptional({ description: 'the `next` of the previous page' })
  @IsOptional()
  @Matches(/^-?\d+:\d+$/, { message: 'after must be the `next` cursor of a previous page' })
  after?: string;

  @ApiPropertyOptional({ description: `entries per page (1..${ENTRY_PAGE_MAX}, default 200)` })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(ENTRY_PAGE_MAX)
  limit?: number;
}
