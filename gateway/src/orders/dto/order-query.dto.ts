import { ApiPropertyOptional } from '@nestjs/swagger';
import { Transform, Type } from 'class-transformer';
import { IsBoolean, IsIn, IsInt, IsOptional, Max, Min } from 'class-validator';
import { ORDER_STATES, type OrderState } from '@stillwell/shared/orders';

export class OrderQueryDto {
  @ApiPropertyOptional({ enum: ORDER_STATES })
  @IsOptional()
  @IsIn(ORDER_STATES)
  state?: OrderState;

  @ApiPropertyOptional({
    description: 'true: only emergency actions still awaiting countersignature',
  })
  @IsOptional()
  @Transform(({ value }: { value: unknown }) =>
    value === 'true' ? true : value === 'false' ? false : value,
  )
  @IsBoolean()
  awaitingCountersign?: boolean;

  @ApiPropertyOptional({ description: 'at most this many, newest first (1..500, default 100)' })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(500)
  limit?: number;
}
