import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { OmitType } from '@nestjs/mapped-types';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsNumber, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength, ValidateIf } from 'class-validator';
import { JOB_STATUSES, type CreateJobRequest, type JobStatus, type ListJobsQuery, type UpdateJobRequest } from '@kilocycle/common/types';
import { IsDateOnly, Trim } from '../../shared/dto-helpers.js';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

const finite = { allowNaN: false, allowInfinity: false } as const;
const statusMessage = `status must be one of: ${JOB_STATUSES.join(', ')}`;

export class CreateJobDto implements CreateJobRequest {
  @IsInt({ message: 'instrumentId must be a whole number' })
  @Min(1)
  instrumentId: number;

  @IsDateOnly('receivedDate')
  receivedDate: string;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(FIELD_LIMITS.notes.max)
  conditionReceived?: string | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsInt({ message: 'technicianId must be a whole number' })
  @Min(1)
  technicianId?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber(finite, { message: 'ambientTempC must be a number' })
  @Min(FIELD_LIMITS.job.ambientTempC.min)
  @Max(FIELD_LIMITS.job.ambientTempC.max)
  ambientTempC?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsNumber(finite, { message: 'humidityPct must be a number' })
  @Min(FIELD_LIMITS.job.humidityPct.min)
  @Max(FIELD_LIMITS.job.humidityPct.max)
  humidityPct?: number | null;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsString()
  @MaxLength(FIELD_LIMITS.notes.max)
  notes?: string | null;
}

export class UpdateJobDto extends PartialUpdateType(OmitType(CreateJobDto, ['instrumentId'] as const)) implements UpdateJobRequest {
  @OptionalNotNull()
  @IsIn(JOB_STATUSES, { message: statusMessage })
  status?: JobStatus;

  /** Why the status changes; required when a lead returns a job for rework. */
  @OptionalNotNull()
  @IsString()
  @Trim()
  @MinLength(FIELD_LIMITS.job.statusComment.min, { message: `comment must be at least ${FIELD_LIMITS.job.statusComment.min} characters` })
  @MaxLength(FIELD_LIMITS.job.statusComment.max)
  comment?: string;
}

export class ListJobsQueryDto extends ListQueryDto implements ListJobsQuery {
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
  @IsInt({ message: 'technicianId must be a whole number' })
  @Min(1)
  technicianId?: number;

  @IsOptional()
  @Matches(new RegExp(`^(${JOB_STATUSES.join('|')})(,(${JOB_STATUSES.join('|')}))*$`), { message: `${statusMessage} (several separated by commas)` })
  status?: string;
}
