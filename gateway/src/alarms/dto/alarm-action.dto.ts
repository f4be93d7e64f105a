import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { IsNumber, IsOptional, IsPositive, IsString, MaxLength } from 'class-validator';
import { COMMENT_MAX } from '@stillwell/shared/alarms';

// The same limits as the zod request schemas in @stillwell/shared/alarms (api.ts). Reasons are
// checked for substance by the lifecycle (at least a few characters), so that its refusal code
// reaches the console.

export class AcknowledgeDto {
  @ApiPropertyOptional({ maxLength: COMMENT_MAX })
  @IsOptional()
  @IsString()
  @MaxLength(COMMENT_MAX)
  comment?: string;
}

export class ShelveDto {
  @ApiProperty({ maxLength: COMMENT_MAX, description: 'why the alarm is shelved (required)' })
  @IsString()
  @MaxLength(COMMENT_MAX)
  reason: string;

  @ApiProperty({
    description: 'site seconds from now until the shelf ends (at most the definition’s shelveMaxS)',
  })
  @IsNumber()
  @IsPositive()
  durationS: number;
}

export class OutOfServiceDto {
  @ApiProperty({
    maxLength: COMMENT_MAX,
    description: 'why the alarm is taken out of service (required)',
  })
  @IsString()
  @MaxLength(COMMENT_MAX)
  reason: string;
}

export class ReturnToServiceDto {
  @ApiPropertyOptional({ maxLength: COMMENT_MAX })
  @IsOptional()
  @IsString()
  @MaxLength(COMMENT_MAX)
  comment?: string;
}
