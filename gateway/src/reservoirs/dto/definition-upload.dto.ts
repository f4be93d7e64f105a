import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { ArrayMaxSize, IsArray, IsOptional, IsString, MaxLength, MinLength } from 'class-validator';

export class StorageTableUploadDto {
  @ApiProperty({
    description:
      'The elevation-area-storage table as CSV text: a header naming elevation, area and storage, then one row per elevation in m, m2 and m3.',
    example: 'elevation,area,storage\n171,0,0\n173,12000,8000\n175,44000,60000',
  })
  @IsString()
  @MinLength(1)
  @MaxLength(1_000_000)
  csv: string;

  @ApiPropertyOptional({
    description: 'why the table changes (kept with the version and in the logbook)',
  })
  @IsOptional()
  @IsString()
  @MaxLength(500)
  note?: string;
}

export class StructuresUploadDto {
  @ApiPropertyOptional({
    description:
      'The outflow structures (replacing the current ones), checked against the shared definition schema.',
    type: 'array',
    items: { type: 'object' },
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(100)
  structures?: unknown[];

  @ApiPropertyOptional({
    description: 'The thresholds (replacing the current ones).',
    type: 'array',
    items: { type: 'object' },
  })
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(200)
  thresholds?: unknown[];

  @ApiPropertyOptional({ description: 'why the definition changes' })
  @IsOptional()
  @IsString()
  @MaxLength(500)
  note?: string;
}
