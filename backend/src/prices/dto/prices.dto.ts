import { MONEY_LIMITS } from '@kilocycle/common/money';
import { Transform } from 'class-transformer';
import { IsBoolean, IsIn, IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength, ValidateIf } from 'class-validator';
import {
  PAYMENT_TERMS,
  PRICE_UNITS,
  type CreatePriceItemRequest,
  type CreateTaxRateRequest,
  type ListPriceItemsQuery,
  type PaymentTerms,
  type PriceUnit,
  type UpdateCustomerTermsRequest,
  type UpdatePriceItemRequest,
  type UpdateTaxRateRequest,
} from '@kilocycle/common/types';
import { QueryBoolean, Trim } from '../../shared/dto-helpers.js';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';
import { SingleLine } from '../../shared/single-line.decorator.js';

/** The lab's own service codes: capitals, digits and - . _ (CAL-RNG, STAB-HR). */
export const PRICE_CODE = /^[A-Z0-9][A-Z0-9._-]{0,31}$/;
export const LIMITS = { description: 500, taxRateName: 100, taxRegistration: 64, netDays: 365 } as const;

export class CreatePriceItemDto implements CreatePriceItemRequest {
  @IsString()
  @Trim()
  @Matches(PRICE_CODE, { message: 'code must be 1 to 32 capital letters, digits, "-", "." or "_", starting with a letter or digit (e.g. CAL-RNG)' })
  code: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'description must not be empty' })
  @MaxLength(LIMITS.description)
  @SingleLine()
  description: string;

  @IsIn(PRICE_UNITS, { message: `unit must be one of: ${PRICE_UNITS.join(', ')}` })
  unit: PriceUnit;

  @IsInt({ message: 'unitPriceMinor must be a whole number of minor units (cents)' })
  @Min(0, { message: 'unitPriceMinor must not be negative' })
  @Max(MONEY_LIMITS.maxUnitPriceMinor, { message: `unitPriceMinor must be at most ${MONEY_LIMITS.maxUnitPriceMinor}` })
  unitPriceMinor: number;

  @OptionalNotNull()
  @IsBoolean({ message: 'proposeOnQuotes must be true or false' })
  proposeOnQuotes?: boolean;
}

export class UpdatePriceItemDto extends PartialUpdateType(CreatePriceItemDto) implements UpdatePriceItemRequest {
  @OptionalNotNull()
  @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;
}

export class ListPriceItemsQueryDto extends ListQueryDto implements ListPriceItemsQuery {
  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;
}

export class ListTaxRatesQueryDto extends ListQueryDto {
  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;
}

export class CreateTaxRateDto implements CreateTaxRateRequest {
  @IsString()
  @Trim()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(LIMITS.taxRateName)
  @SingleLine()
  name: string;

  @IsInt({ message: 'rateBasisPoints must be a whole number of basis points (20 % = 2000)' })
  @Min(0, { message: 'rateBasisPoints must not be negative' })
  @Max(MONEY_LIMITS.maxRateBasisPoints, { message: `rateBasisPoints must be at most ${MONEY_LIMITS.maxRateBasisPoints} (100 %)` })
  rateBasisPoints: number;
}

export class UpdateTaxRateDto extends PartialUpdateType(CreateTaxRateDto) implements UpdateTaxRateRequest {
  @OptionalNotNull()
  @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;
}

export class UpdateCustomerTermsDto implements UpdateCustomerTermsRequest {
  /** null: exempt (then taxRegistration is required). */
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'taxRateId must be a whole number, or null for an exempt customer' })
  @Min(1)
  taxRateId: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @Transform(({ value }) => (typeof value === 'string' ? value.trim() || null : value))
  @MaxLength(LIMITS.taxRegistration)
  @SingleLine()
  taxRegistration?: string | null;

  @IsIn(PAYMENT_TERMS, { message: `paymentTerms must be one of: ${PAYMENT_TERMS.join(', ')}` })
  paymentTerms: PaymentTerms;

  @IsInt({ message: 'netDays must be a whole number of days' })
  @Min(0, { message: 'netDays must not be negative' })
  @Max(LIMITS.netDays, { message: `netDays must be at most ${LIMITS.netDays}` })
  netDays: number;

  @IsBoolean({ message: 'requiresQuote must be true or false' })
  requiresQuote: boolean;
}
