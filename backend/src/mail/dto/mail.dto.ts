import { IsOptional, IsString, Matches } from 'class-validator';
import type { ListMailQuery } from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';

export class ListMailQueryDto extends ListQueryDto implements ListMailQuery {
  @IsOptional()
  @IsString()
  @Matches(/^[a-z_]{1,32}$/, { message: 'kind must be a mail kind such as certificate_issued' })
  kind?: string;
}
