import { Type } from 'class-transformer';
import { ArrayMaxSize, IsArray, IsBoolean, IsIn, IsInt, IsOptional, IsString, Max, MaxLength, Min, MinLength, ValidateNested } from 'class-validator';
import { MONEY_LIMITS } from '@kilocycle/common/money';
import {
  INVOICE_STATUSES,
  PRICE_UNITS,
  type BillingLineInput,
  type CreateCreditNoteRequest,
  type InvoiceStatus,
  type ListInvoicesQuery,
  type PriceUnit,
  type UpdateInvoiceRequest,
} from '@kilocycle/common/types';
import { IsDateOnly, QueryBoolean, Trim } from '../../shared/dto-helpers.js';
import { DecimalInteger, ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';

export class InvoiceLineDto implements BillingLineInput {
  @IsOptional() @IsInt() @Min(1) @Max(2_147_483_647) priceItemId?: number | null;
  @IsOptional() @IsString() @Trim() @MaxLength(32) @SingleLine() code?: string | null;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'description: say what the line is for' })
  @MaxLength(500)
  @SingleLine()
  description: string;

  @IsIn(PRICE_UNITS, { message: `unit must be one of ${PRICE_UNITS.join(', ')}` }) unit: PriceUnit;

  @IsInt({ message: 'quantityMilli must be a whole number of thousandths (1.5 h = 1500)' })
  @Min(0)
  @Max(MONEY_LIMITS.maxQuantityMilli)
  quantityMilli: number;

  @IsInt({ message: 'unitPriceMinor must be a whole number of minor units (cents)' })
  @Min(0)
  @Max(MONEY_LIMITS.maxUnitPriceMinor)
  unitPriceMinor: number;
}

export class UpdateInvoiceDto implements UpdateInvoiceRequest {
  @IsArray()
  @ArrayMaxSize(MONEY_LIMITS.maxLines)
  @ValidateNested({ each: true })
  @Type(() => InvoiceLineDto)
  lines: InvoiceLineDto[];
}

export class CreateCreditNoteDto implements CreateCreditNoteRequest {
  @IsInt({ message: 'amountMinor must be a whole number of minor units (cents)' })
  @Min(1, { message: 'amountMinor must be above zero' })
  @Max(Number.MAX_SAFE_INTEGER)
  amountMinor: number;

  @IsString()
  @Trim()
  @MinLength(3, { message: 'reason: say why the invoice is credited' })
  @MaxLength(500)
  @SingleLine()
  reason: string;
}

export class ListInvoicesQueryDto extends ListQueryDto implements ListInvoicesQuery {
  @IsOptional() @DecimalInteger() @IsInt() @Min(1) @Max(2_147_483_647) jobId?: number;
  @IsOptional() @DecimalInteger() @IsInt() @Min(1) @Max(2_147_483_647) organizationId?: number;
  @IsOptional() @IsIn(INVOICE_STATUSES, { message: `status must be one of ${INVOICE_STATUSES.join(', ')}` }) status?: InvoiceStatus;
  @IsOptional() @QueryBoolean() @IsBoolean({ message: 'overdue must be true or false' }) overdue?: boolean;
}

export class InvoiceExportQueryDto {
  @IsOptional() @IsDateOnly('from') from?: string;
  @IsOptional() @IsDateOnly('to') to?: string;
}
