import { Transform, Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import type { RefundPaymentRequest } from '@kilocycle/common/types';
import { MONEY_LIMITS } from '@kilocycle/common/money';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';

export class ListPaymentsQueryDto extends ListQueryDto {
  @IsOptional() @Type(() => Number) @IsInt() @Min(1) invoiceId?: number;
}

export class RefundPaymentDto implements RefundPaymentRequest {
  @IsInt({ message: 'amountMinor must be a whole number of minor units (cents)' })
  @Min(1, { message: 'amountMinor must be at least 1' })
  @Max(MONEY_LIMITS.maxUnitPriceMinor, { message: `amountMinor must be at most ${MONEY_LIMITS.maxUnitPriceMinor}` })
  amountMinor: number;

  @IsString()
  @Transform(({ value }) => (typeof value === 'string' ? value.trim() : value))
  @SingleLine()
  @MinLength(3, { message: 'reason: say why the payment is refunded (3 characters or more)' })
  @MaxLength(500)
  reason: string;
}
