import { IsBoolean, IsIn, IsNumber, IsOptional, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import {
  STANDARD_KINDS,
  type CreateStandardRequest,
  type ListStandardsQuery,
  type StandardKind,
  type UpdateStandardRequest,
} from '@kilocycle/common/types';
import { IsDateOnly, QueryBoolean, Trim } from '../../shared/dto-helpers.js';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

const kindMessage = `kind must be one of: ${STANDARD_KINDS.join(', ')}`;

export class CreateStandardDto implements CreateStandardRequest {
  @IsString()
  @Trim()
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(120)
  @SingleLine()
  name: string;

  @IsIn(STANDARD_KINDS, { message: kindMessage })
  kind: StandardKind;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'makeModel must not be empty' })
  @MaxLength(160)
  @SingleLine()
  makeModel: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'serial must not be empty' })
  @MaxLength(120)
  @SingleLine()
  serial: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'certificateNumber must not be empty' })
  @MaxLength(120)
  @SingleLine()
  certificateNumber: string;

  @IsDateOnly('dueDate')
  dueDate: string;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'timebaseAccuracyPpm must be a number' })
  @Min(0)
  @Max(1000)
  timebaseAccuracyPpm: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'resolutionHz must be a number' })
  @Min(1e-12, { message: 'resolutionHz must be greater than zero' })
  @Max(1e6)
  resolutionHz: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'calibrationUPpm must be a number' })
  @Min(0)
  @Max(1000)
  calibrationUPpm: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'calibrationK must be a number' })
  @Min(1)
  @Max(10)
  calibrationK: number;
}

export class UpdateStandardDto extends PartialUpdateType(CreateStandardDto) implements UpdateStandardRequest {
  @OptionalNotNull() @IsBoolean()
  active?: boolean;
}

export class ListStandardsQueryDto extends ListQueryDto implements ListStandardsQuery {
  @IsOptional() @IsIn(STANDARD_KINDS, { message: kindMessage })
  kind?: StandardKind;

  @IsOptional() @QueryBoolean() @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;

  @IsOptional() @QueryBoolean() @IsBoolean({ message: 'overdue must be true or false' })
  overdue?: boolean;

  @IsOptional() @IsDateOnly('dueBefore')
  dueBefore?: string;
}

