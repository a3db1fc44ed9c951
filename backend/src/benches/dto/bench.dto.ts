import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { Transform } from 'class-transformer';
import { IsBoolean, IsInt, IsOptional, IsString, MaxLength, Min, MinLength, ValidateIf } from 'class-validator';
import type { CreateBenchRequest, UpdateBenchRequest } from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

const trim = ({ value }: { value: unknown }) => (typeof value === 'string' ? value.trim() : value);

export class CreateBenchDto implements CreateBenchRequest {
  @IsString()
  @Transform(trim)
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(FIELD_LIMITS.bench.name.max)
  @SingleLine()
  name: string;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @Transform(trim)
  @MaxLength(FIELD_LIMITS.bench.location.max)
  @SingleLine()
  location?: string | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'defaultStandardId must be the id of a reference standard' })
  @Min(1)
  defaultStandardId?: number | null;
}

export class UpdateBenchDto extends PartialUpdateType(CreateBenchDto) implements UpdateBenchRequest {
  @OptionalNotNull()
  @IsBoolean()
  active?: boolean;
}

export class ListBenchesQueryDto extends ListQueryDto {
  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  active?: boolean;
}
