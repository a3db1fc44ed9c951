import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { IsBoolean, IsIn, IsNumber, IsOptional, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import { STANDARD_KINDS, type CreateStandardRequest, type ListStandardsQuery, type StandardKind, type UpdateStandardRequest } from '@kilocycle/common/types';
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
  @MaxLength(FIELD_LIMITS.standard.name.max)
  @SingleLine()
  name: string;

  @IsIn(STANDARD_KINDS, { message: kindMessage })
  kind: StandardKind;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'makeModel must not be empty' })
  @MaxLength(FIELD_LIMITS.standard.makeModel.max)
  @SingleLine()
  makeModel: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'serial must not be empty' })
  @MaxLength(FIELD_LIMITS.standard.text.max)
  @SingleLine()
  serial: string;

  @IsString()
  @Trim()
  @MinLength(1, { message: 'certificateNumber must not be empty' })
  @MaxLength(FIELD_LIMITS.standard.text.max)
  @SingleLine()
  certificateNumber: string;

  @IsDateOnly('dueDate')
  dueDate: string;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'timebaseAccuracyPpm must be a number' })
  @Min(FIELD_LIMITS.standard.timebaseAccuracyPpm.min)
  @Max(FIELD_LIMITS.standard.timebaseAccuracyPpm.max)
  timebaseAccuracyPpm: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'resolutionHz must be a number' })
  @Min(FIELD_LIMITS.standard.resolutionHz.min, { message: 'resolutionHz must be greater than zero' })
  @Max(FIELD_LIMITS.standard.resolutionHz.max)
  resolutionHz: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'calibrationUPpm must be a number' })
  @Min(FIELD_LIMITS.standard.calibrationUPpm.min)
  @Max(FIELD_LIMITS.standard.calibrationUPpm.max)
  calibrationUPpm: number;

  @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'calibrationK must be a number' })
  @Min(FIELD_LIMITS.standard.calibrationK.min)
  @Max(FIELD_LIMITS.standard.calibrationK.max)
  calibrationK: number;
}

export class UpdateStandardDto extends PartialUpdateType(CreateStandardDto) implements UpdateStandardRequest {
  @OptionalNotNull()
  @IsBoolean()
  active?: boolean;
}

export class ListStandardsQueryDto extends ListQueryDto implements ListStandardsQuery {
  @IsOptional()
  @IsIn(STANDARD_KINDS, { message: kindMessage })
  kind?: StandardKind;

  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;

  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'overdue must be true or false' })
  overdue?: boolean;

  @IsOptional()
  @IsDateOnly('dueBefore')
  dueBefore?: string;
}
