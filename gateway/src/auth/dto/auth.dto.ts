import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import { IsOptional, IsString, Length, Matches, MaxLength, MinLength } from 'class-validator';
import { PASSWORD_RULES } from '@stillwell/shared/access';

// The same limits as the zod schemas in @stillwell/shared/access (api.ts).
const TYPED_MAX = PASSWORD_RULES.maxLength * 4;

export class SignInDto {
  @ApiProperty()
  @IsString()
  @Length(1, 128)
  username: string;

  @ApiProperty({ description: 'as typed; the rules apply when a password is set, not here' })
  @IsString()
  @Length(1, TYPED_MAX)
  password: string;

  @ApiPropertyOptional({ description: 'six digits, when the account has a second factor' })
  @IsOptional()
  @Matches(/^\d{6}$/)
  totp?: string;
}

export class StepUpDto {
  @ApiProperty()
  @IsString()
  @Length(1, TYPED_MAX)
  password: string;

  @ApiPropertyOptional({ description: 'six digits, when the account has a second factor' })
  @IsOptional()
  @Matches(/^\d{6}$/)
  totp?: string;
}

export class ChangePasswordDto {
  @ApiProperty()
  @IsString()
  @Length(1, TYPED_MAX)
  currentPassword: string;

  @ApiProperty({
    description: `${PASSWORD_RULES.minLength}+ characters (${PASSWORD_RULES.adminMinLength}+ for administrators), not a common password`,
  })
  @IsString()
  @MinLength(1)
  @MaxLength(TYPED_MAX)
  newPassword: string;
}

export class UpdateMeDto {
  @ApiProperty({ minLength: 1, maxLength: 100 })
  @Transform(({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value))
  @IsString()
  @Length(1, 100)
  displayName: string;
}

export class TotpCodeDto {
  @ApiProperty({ description: 'six digits from the authenticator' })
  @Matches(/^\d{6}$/)
  code: string;
}
