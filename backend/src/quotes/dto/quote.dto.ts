import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { MONEY_LIMITS } from '@kilocycle/common/money';
import { Type } from 'class-transformer';
import { ArrayMaxSize, IsArray, IsIn, IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength, ValidateIf, ValidateNested } from 'class-validator';
import {
  ACCEPTANCE_CHANNELS,
  PRICE_UNITS,
  QUOTE_STATUSES,
  type AcceptanceChannel,
  type AcceptQuoteRequest,
  type BillingLineInput,
  type DeclineQuoteRequest,
  type ListQuotesQuery,
  type PriceUnit,
  type QuoteStatus,
  type UpdateQuoteRequest,
} from '@kilocycle/common/types';
import { Trim } from '../../shared/dto-helpers.js';
import { DecimalInteger, ListQueryDto } from '../../shared/list-query.dto.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { SingleLine } from '../../shared/single-line.decorator.js';

/** Same rule as the price list's codes (prices/dto/prices.dto.ts). */
const LINE_CODE = /^[A-Z0-9][A-Z0-9._-]{0,31}$/;
export const QUOTE_LIMITS = { description: 500, validityDays: { min: 1, max: 365 }, decisionNote: 2000 } as const;

export class BillingLineInputDto implements BillingLineInput {
  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'priceItemId must be a whole number' })
  @Min(1)
  priceItemId?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @Matches(LINE_CODE, { message: 'code must be 1 to 32 capital letters, digits, "-", "." or "_"' })
  code?: string | null;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'description must not be empty' })
  @MaxLength(QUOTE_LIMITS.description)
  @SingleLine()
  description: string;

  @IsIn(PRICE_UNITS, { message: `unit must be one of: ${PRICE_UNITS.join(', ')}` })
  unit: PriceUnit;

  @IsInt({ message: 'quantityMilli must be a whole number of thousandths (1.5 h = 1500)' })
  @Min(1, { message: 'quantityMilli must be at least 1 (a thousandth)' })
  @Max(MONEY_LIMITS.maxQuantityMilli, { message: `quantityMilli must be at most ${MONEY_LIMITS.maxQuantityMilli}` })
  quantityMilli: number;

  @IsInt({ message: 'unitPriceMinor must be a whole number of minor units (cents)' })
  @Min(0, { message: 'unitPriceMinor must not be negative' })
  @Max(MONEY_LIMITS.maxUnitPriceMinor, { message: `unitPriceMinor must be at most ${MONEY_LIMITS.maxUnitPriceMinor}` })
  unitPriceMinor: number;
}

export class UpdateQuoteDto implements UpdateQuoteRequest {
  /** The whole set of lines, in order. */
  @OptionalNotNull()
  @IsArray({ message: 'lines must be a list' })
  @ArrayMaxSize(MONEY_LIMITS.maxLines, { message: `lines must hold at most ${MONEY_LIMITS.maxLines} lines` })
  @ValidateNested({ each: true })
  @Type(() => BillingLineInputDto)
  lines?: BillingLineInputDto[];

  @OptionalNotNull()
  @IsInt({ message: 'validityDays must be a whole number of days' })
  @Min(QUOTE_LIMITS.validityDays.min, { message: `validityDays must be at least ${QUOTE_LIMITS.validityDays.min}` })
  @Max(QUOTE_LIMITS.validityDays.max, { message: `validityDays must be at most ${QUOTE_LIMITS.validityDays.max}` })
  validityDays?: number;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(FIELD_LIMITS.notes.max)
  notes?: string | null;
}

export class AcceptQuoteDto implements AcceptQuoteRequest {
  /** Left out (or portal) by a client; phone, email or in_person when the lab records an acceptance. */
  @OptionalNotNull()
  @IsIn(ACCEPTANCE_CHANNELS, { message: `channel must be one of: ${ACCEPTANCE_CHANNELS.join(', ')}` })
  channel?: AcceptanceChannel;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @Trim()
  @MaxLength(QUOTE_LIMITS.decisionNote)
  note?: string | null;
}

export class DeclineQuoteDto implements DeclineQuoteRequest {
  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @Trim()
  @MaxLength(QUOTE_LIMITS.decisionNote)
  note?: string | null;
}

export class ListQuotesQueryDto extends ListQueryDto implements ListQuotesQuery {
  @IsOptional()
  @DecimalInteger()
  @IsInt({ message: 'jobId must be a whole number' })
  @Min(1)
  jobId?: number;

  @IsOptional()
  @DecimalInteger()
  @IsInt({ message: 'organizationId must be a whole number' })
  @Min(1)
  organizationId?: number;

  @IsOptional()
  @IsIn(QUOTE_STATUSES, { message: `status must be one of: ${QUOTE_STATUSES.join(', ')}` })
  status?: QuoteStatus;
}
