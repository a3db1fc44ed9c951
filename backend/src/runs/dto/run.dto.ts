import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { OmitType } from '@nestjs/mapped-types';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsNumber, IsOptional, IsString, Max, MaxLength, Min, MinLength, ValidateIf } from 'class-validator';
import {
  RUN_DATA_KINDS,
  RUN_KINDS,
  RUN_STATUSES,
  type CreateRunRequest,
  type ListRunsQuery,
  type RunDataKind,
  type RunKind,
  type RunStatus,
  type UpdateRunRequest,
} from '@kilocycle/common/types';
import { Trim } from '../../shared/dto-helpers.js';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

const finite = { allowNaN: false, allowInfinity: false } as const;
const kindMessage = `kind must be one of: ${RUN_KINDS.join(', ')}`;

export class CreateRunDto implements CreateRunRequest {
  @IsInt({ message: 'rangeId must be a whole number' })
  @Min(1)
  rangeId: number;

  @IsIn(RUN_KINDS, { message: kindMessage })
  kind: RunKind;

  @OptionalNotNull()
  @IsIn(RUN_DATA_KINDS, { message: `dataKind must be one of: ${RUN_DATA_KINDS.join(', ')}` })
  dataKind?: RunDataKind;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'benchId must be a whole number' })
  @Min(1)
  benchId?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'standardId must be a whole number' })
  @Min(1)
  standardId?: number | null;

  @OptionalNotNull()
  @IsString()
  @Trim()
  @MinLength(FIELD_LIMITS.run.overrideReason.min, { message: `standardOverrideReason must be at least ${FIELD_LIMITS.run.overrideReason.min} characters` })
  @MaxLength(FIELD_LIMITS.run.overrideReason.max)
  standardOverrideReason?: string;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber(finite, { message: 'supplyVoltage must be a number' })
  @Min(FIELD_LIMITS.run.supplyVoltage.min)
  @Max(FIELD_LIMITS.run.supplyVoltage.max)
  supplyVoltage?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(5000)
  configuration?: string | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(5000)
  notes?: string | null;
}

export class UpdateRunDto extends PartialUpdateType(OmitType(CreateRunDto, ['rangeId', 'kind', 'dataKind', 'benchId'] as const)) implements UpdateRunRequest {
  @OptionalNotNull()
  @IsIn(['closed'], { message: 'status can only be set to closed (a closed run stays closed)' })
  status?: 'closed';

  @OptionalNotNull()
  @IsString({ message: 'reason must be text' })
  @Trim()
  @MinLength(FIELD_LIMITS.run.correctionReason.min, { message: `reason must be at least ${FIELD_LIMITS.run.correctionReason.min} characters` })
  @MaxLength(FIELD_LIMITS.run.correctionReason.max)
  reason?: string;
}

export class ListRunsQueryDto extends ListQueryDto implements ListRunsQuery {
  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'organizationId must be a whole number' })
  @Min(1)
  organizationId?: number;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'instrumentId must be a whole number' })
  @Min(1)
  instrumentId?: number;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'jobId must be a whole number' })
  @Min(1)
  jobId?: number;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'rangeId must be a whole number' })
  @Min(1)
  rangeId?: number;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'benchId must be a whole number' })
  @Min(1)
  benchId?: number;

  @IsOptional()
  @IsIn(RUN_KINDS, { message: kindMessage })
  kind?: RunKind;

  @IsOptional()
  @IsIn(RUN_STATUSES, { message: `status must be one of: ${RUN_STATUSES.join(', ')}` })
  status?: RunStatus;
}
