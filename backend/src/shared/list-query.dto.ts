import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min } from 'class-validator';
import { MAX_PAGE_SIZE, type ListQuery } from '@kilocycle/common/types';
import { SingleLine } from './single-line.decorator.js';

/** Query parameters every list endpoint takes; endpoints extend it with their own filters. */
export class ListQueryDto implements ListQuery {
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  page?: number;

  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(MAX_PAGE_SIZE)
  pageSize?: number;

  @IsOptional()
  @IsString()
  @Matches(/^-?[a-zA-Z]+$/, { message: 'sort must be a field name, optionally preceded by - for descending' })
  sort?: string;

  @IsOptional()
  @IsString()
  @MaxLength(200)
  @SingleLine()
  q?: string;
}
