import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { OmitType, PartialType } from '@nestjs/mapped-types';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  ArrayUnique,
  IsArray,
  IsInt,
  IsNotEmpty,
  IsNumber,
  IsOptional,
  IsString,
  Max,
  MaxLength,
  Min,
  ValidateIf,
} from 'class-validator';
import {
  MAX_COMPARED_RUNS,
  MIN_COMPARED_RUNS,
  type ComputeComparisonRequest,
  type CreateComparisonRequest,
  type ListComparisonsQuery,
  type UpdateComparisonRequest,
} from '@kilocycle/common/types';
import { Trim } from '../../shared/dto-helpers.js';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';

const finite = { allowNaN: false, allowInfinity: false } as const;

export class ComputeComparisonDto implements ComputeComparisonRequest {
  @IsArray()
  @ArrayMinSize(MIN_COMPARED_RUNS, { message: `runIds must list ${MIN_COMPARED_RUNS} to ${MAX_COMPARED_RUNS} runs` })
  @ArrayMaxSize(MAX_COMPARED_RUNS, { message: `runIds must list ${MIN_COMPARED_RUNS} to ${MAX_COMPARED_RUNS} runs` })
  @ArrayUnique({ message: 'runIds: each run may appear only once' })
  @IsInt({ each: true, message: 'runIds must be whole numbers' })
  @Min(1, { each: true })
  runIds: number[];

  /** One per run, in the same order ("before: original regulator"); empty ones become "run <id>". */
  @OptionalNotNull()
  @IsArray()
  @IsString({ each: true })
  @MaxLength(FIELD_LIMITS.comparison.label.max, { each: true })
  @SingleLine({ each: true })
  labels?: string[];

  @OptionalNotNull()
  @IsNumber(finite, { message: 'withinHz must be a number of hertz' })
  @Min(0.000001)
  @Max(1e9)
  withinHz?: number;

  @OptionalNotNull()
  @IsNumber(finite, { message: 'windowSeconds must be a number of seconds' })
  @Min(1)
  @Max(31 * 86400)
  windowSeconds?: number;
}

export class CreateComparisonDto extends ComputeComparisonDto implements CreateComparisonRequest {
  @IsString()
  @Trim()
  @IsNotEmpty({ message: 'title must not be empty' })
  @MaxLength(FIELD_LIMITS.comparison.title.max)
  @SingleLine()
  title: string;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(FIELD_LIMITS.notes.max)
  notes?: string | null;
}

// skipNullProperties: false — left out is fine, but null is checked (and refused) like any other value.
export class UpdateComparisonDto
  extends PartialType(OmitType(CreateComparisonDto, ['withinHz', 'windowSeconds'] as const), { skipNullProperties: false })
  implements UpdateComparisonRequest
{
  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber(finite, { message: 'withinHz must be a number of hertz' })
  @Min(0.000001)
  @Max(1e9)
  withinHz?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber(finite, { message: 'windowSeconds must be a number of seconds' })
  @Min(1)
  @Max(31 * 86400)
  windowSeconds?: number | null;
}

export class ListComparisonsQueryDto extends ListQueryDto implements ListComparisonsQuery {
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'instrumentId must be a whole number' })
  @Min(1)
  instrumentId?: number;
}
