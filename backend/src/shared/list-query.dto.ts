import { Transform } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min } from 'class-validator';
import { MAX_PAGE, MAX_PAGE_SIZE, type ListQuery } from '@kilocycle/common/types';
import { SingleLine } from './single-line.decorator.js';

/** Digits only become a number; anything else (1e20, 0x10, 2.0) stays text for @IsInt to refuse by name. */
export const DecimalInteger = () => Transform(({ value }) => (typeof value === 'string' && /^\d{1,15}$/.test(value) ? Number(value) : value));

/** Query parameters every list endpoint takes; endpoints extend it with their own filters. */
export class ListQueryDto implements ListQuery {
  @IsOptional()
  @DecimalInteger()
  @IsInt()
  @Min(1)
  @Max(MAX_PAGE)
  page?: number;

  @IsOptional()
  @DecimalInteger()
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
