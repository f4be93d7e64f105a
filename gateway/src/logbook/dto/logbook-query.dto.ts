import { ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  IsIn,
  IsISO8601,
  IsInt,
  IsOptional,
  IsString,
  Matches,
  Max,
  MaxLength,
  Min,
} from 'class-validator';

export const LOGBOOK_SORT_FIELDS = ['seq', 'time', 'kind', 'actorName'] as const;

/** The filters of the logbook: the grid's and the CSV export's. */
export class LogbookFilterDto {
  @ApiPropertyOptional({ description: 'entry kind, or a prefix ending in "." (e.g. "auth.")' })
  @IsOptional()
  @IsString()
  @MaxLength(64)
  @Matches(/^[a-z0-9.-]+$/)
  kind?: string;

  @ApiPropertyOptional({ description: 'actor user name' })
  @IsOptional()
  @IsString()
  @MaxLength(64)
  actor?: string;

  @ApiPropertyOptional({
    description: 'a gate or valve id: entries about it (their payload lists it in controls)',
  })
  @IsOptional()
  @IsString()
  @Matches(/^[a-z0-9][a-z0-9-]{0,63}$/)
  gate?: string;

  @ApiPropertyOptional({ description: 'entries at or after this time (ISO 8601)' })
  @IsOptional()
  @IsISO8601({ strict: true })
  from?: string;

  @ApiPropertyOptional({ description: 'entries at or before this time (ISO 8601)' })
  @IsOptional()
  @IsISO8601({ strict: true })
  to?: string;
}

export class LogbookQueryDto extends LogbookFilterDto {
  @ApiPropertyOptional({ description: 'page number, from 0' })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  page?: number;

  @ApiPropertyOptional({ description: 'entries per page (1..100)' })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(100)
  pageSize?: number;

  @ApiPropertyOptional({ enum: LOGBOOK_SORT_FIELDS })
  @IsOptional()
  @IsIn(LOGBOOK_SORT_FIELDS)
  sort?: (typeof LOGBOOK_SORT_FIELDS)[number];

  @ApiPropertyOptional({ enum: ['asc', 'desc'] })
  @IsOptional()
  @IsIn(['asc', 'desc'])
  order?: 'asc' | 'desc';
}

export class VerifyQueryDto {
  @ApiPropertyOptional({ description: 'a published head: its sequence number' })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  headSeq?: number;

  @ApiPropertyOptional({ description: 'a published head: its hash (64 hex digits)' })
  @IsOptional()
  @Matches(/^[0-9a-f]{64}$/)
  headHash?: string;
}
