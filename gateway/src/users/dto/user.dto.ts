import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Transform } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  ArrayUnique,
  IsArray,
  IsBoolean,
  IsIn,
  IsOptional,
  IsString,
  Length,
  Matches,
} from 'class-validator';
import { ROLES, type Role } from '@stillwell/shared/access';

// The same limits as the zod schemas in @stillwell/shared/access (api.ts).
const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);
const username = ({ value }: { value: unknown }) =>
  typeof value === 'string' ? value.normalize('NFKC').trim().toLowerCase() : value;

class RolesField {
  @ApiProperty({ enum: ROLES, isArray: true, description: 'one or more roles' })
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(ROLES.length)
  @ArrayUnique()
  @IsIn(ROLES, { each: true })
  roles: Role[];
}

export class CreateUserDto extends RolesField {
  @ApiProperty({
    description: "2-64 characters: letters, digits, '.', '_' or '-'; stored lower-case",
  })
  @Transform(username)
  @IsString()
  @Matches(/^[a-z0-9][a-z0-9._-]{1,63}$/)
  username: string;

  @ApiProperty({ minLength: 1, maxLength: 100 })
  @Transform(trim)
  @IsString()
  @Length(1, 100)
  displayName: string;
}

export class UpdateUserDto {
  @ApiPropertyOptional({ minLength: 1, maxLength: 100 })
  @IsOptional()
  @Transform(trim)
  @IsString()
  @Length(1, 100)
  displayName?: string;

  @ApiPropertyOptional({ enum: ROLES, isArray: true })
  @IsOptional()
  @IsArray()
  @ArrayMinSize(1)
  @ArrayMaxSize(ROLES.length)
  @ArrayUnique()
  @IsIn(ROLES, { each: true })
  roles?: Role[];

  @ApiPropertyOptional({ description: 'true ends every session of the user at once' })
  @IsOptional()
  @IsBoolean()
  disabled?: boolean;
}

export class ResetPasswordDto {
  @ApiPropertyOptional({ description: 'also remove the second factor (a lost authenticator)' })
  @IsOptional()
  @IsBoolean()
  removeTotp?: boolean;
}
