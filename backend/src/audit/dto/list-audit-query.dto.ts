import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, MaxLength, Min } from 'class-validator';
import type { ListAuditQuery } from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';

export class ListAuditQueryDto extends ListQueryDto implements ListAuditQuery {
  @IsOptional()
  @IsString()
  @Matches(/^[a-z_]+$/, { message: 'entity must be a record kind such as job, run, reading' })
  @MaxLength(40)
  entity?: string;

  @IsOptional()
  @IsString()
  @MaxLength(40)
  entityId?: string;

  @IsOptional()
  @Type(() => Number)
  @IsInt({ message: 'jobId must be a whole number' })
  @Min(1)
  jobId?: number;

  @IsOptional()
  @IsString()
  @Matches(/^[a-z_]+$/, { message: 'action must be an action such as create, update, exclude' })
  @MaxLength(40)
  action?: string;
}
