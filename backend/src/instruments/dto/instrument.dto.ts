import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { OmitType } from '@nestjs/mapped-types';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsInt,
  IsNumber,
  IsObject,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  MinLength,
  ValidateIf,
  ValidateNested,
} from 'class-validator';
import {
  DIAL_UNITS,
  type BandPlanQuery,
  type CreateInstrumentRequest,
  type DialLaw,
  type DialUnit,
  type ListInstrumentsQuery,
  type RangeInput,
  type Tolerance,
  type UpdateInstrumentRequest,
} from '@kilocycle/common/types';
import { ITU_REGIONS_WITH_BANDS, type ItuRegion } from '@kilocycle/common/math';
import { IsDateOnly, QueryBoolean, Trim } from '../../shared/dto-helpers.js';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

export const MAX_RANGES = 32;
const finite = { allowNaN: false, allowInfinity: false } as const;

/** One range in an instrument's POST/PATCH; dialLaw and tolerance (unions) are checked by the service. */
export class RangeInputDto implements RangeInput {
  @OptionalNotNull()
  @IsInt({ message: 'id must be a whole number' })
  @Min(1)
  id?: number;

  /** Accepted so a range can be sent back as it was read; the order of the list decides the positions. */
  @OptionalNotNull()
  @IsInt({ message: 'position must be a whole number' })
  position?: number;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'label must not be empty' })
  @MaxLength(FIELD_LIMITS.range.label.max)
  @SingleLine()
  label: string;

  @IsIn(DIAL_UNITS, { message: `dialUnit must be one of: ${DIAL_UNITS.join(', ')}` })
  dialUnit: DialUnit;

  @IsObject({ message: "dialLaw must be an object: {kind: 'direct', unit} or {kind: 'table', points}" })
  dialLaw: DialLaw;

  @IsNumber(finite, { message: 'dialMin must be a number' })
  dialMin: number;

  @IsNumber(finite, { message: 'dialMax must be a number' })
  dialMax: number;

  @IsNumber(finite, { message: 'freqMinHz must be a number' })
  @Min(1e-3, { message: 'freqMinHz must be greater than zero' })
  @Max(1e11)
  freqMinHz: number;

  @IsNumber(finite, { message: 'freqMaxHz must be a number' })
  @Min(1e-3, { message: 'freqMaxHz must be greater than zero' })
  @Max(1e11)
  freqMaxHz: number;

  @IsObject({ message: "tolerance must be an object: {kind: 'percent', percent} or {kind: 'ppm_hz', ppm, hz}" })
  tolerance: Tolerance;

  @IsArray({ message: 'multipliers must be a list of whole numbers' })
  @ArrayMinSize(1, { message: 'multipliers must hold at least 1 (×1)' })
  @ArrayMaxSize(16)
  @IsInt({ each: true, message: 'multipliers must be whole numbers' })
  @Min(1, { each: true, message: 'multipliers must be 1 or more' })
  @Max(64, { each: true, message: 'multipliers must be 64 or less' })
  multipliers: number[];
}

export class CreateInstrumentDto implements CreateInstrumentRequest {
  @IsInt({ message: 'organizationId must be a whole number' })
  @Min(1)
  organizationId: number;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'make must not be empty' })
  @MaxLength(FIELD_LIMITS.instrument.text.max)
  @SingleLine()
  make: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'model must not be empty' })
  @MaxLength(FIELD_LIMITS.instrument.text.max)
  @SingleLine()
  model: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'serial must not be empty' })
  @MaxLength(FIELD_LIMITS.instrument.text.max)
  @SingleLine()
  serial: string;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @Trim()
  @MaxLength(FIELD_LIMITS.instrument.text.max)
  @SingleLine()
  assetTag?: string | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(FIELD_LIMITS.notes.max)
  description?: string | null;

  @OptionalNotNull()
  @IsInt({ message: 'recallIntervalMonths must be a whole number' })
  @Min(FIELD_LIMITS.instrument.recallIntervalMonths.min)
  @Max(FIELD_LIMITS.instrument.recallIntervalMonths.max)
  recallIntervalMonths?: number;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsDateOnly('nextDueDate')
  nextDueDate?: string | null;

  @OptionalNotNull()
  @IsArray({ message: 'ranges must be a list' })
  @ArrayMaxSize(MAX_RANGES)
  @ValidateNested({ each: true })
  @Type(() => RangeInputDto)
  ranges?: RangeInputDto[];
}

/** ranges, when sent, is the whole set, in order: items with an id keep that range, items without are added, missing ones are removed. */
export class UpdateInstrumentDto extends PartialUpdateType(OmitType(CreateInstrumentDto, ['organizationId'] as const)) implements UpdateInstrumentRequest {}

export class ListInstrumentsQueryDto extends ListQueryDto implements ListInstrumentsQuery {
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'organizationId must be a whole number' })
  @Min(1)
  organizationId?: number;

  @IsOptional()
  @IsDateOnly('dueBefore')
  dueBefore?: string;

  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'overdue must be true or false' })
  overdue?: boolean;
}

export class BandPlanQueryDto implements BandPlanQuery {
  @IsOptional()
  @Type(() => Number)
  @IsIn([...ITU_REGIONS_WITH_BANDS], { message: `region must be an ITU region with a band table: ${ITU_REGIONS_WITH_BANDS.join(', ')}` })
  region?: ItuRegion;

  @IsOptional()
  @Type(() => Number)
  @IsNumber(finite, { message: 'wantedHz must be a number in Hz' })
  @Min(1, { message: 'wantedHz must be greater than zero' })
  @Max(1e11)
  wantedHz?: number;
}
