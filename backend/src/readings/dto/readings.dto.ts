import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { ArrayMaxSize, ArrayMinSize, IsArray, IsBoolean, IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength } from 'class-validator';
import {
  MAX_PAGE,
  MAX_PAGE_SIZE,
  type AppendReadingsRequest,
  type ExcludeReadingRequest,
  type ListReadingsQuery,
  type ReadingInput,
} from '@kilocycle/common/types';
import { QueryBoolean, Trim } from '../../shared/dto-helpers.js';
import { DecimalInteger } from '../../shared/list-query.dto.js';
import { MAX_BATCH } from '../readings-writer.service.js';

/** Each reading is checked by ReadingsWriter (the one write path), which names the field that is wrong. */
export class AppendReadingsDto implements AppendReadingsRequest {
  @IsArray({ message: 'readings must be a list' })
  @ArrayMinSize(1, { message: 'readings must hold at least 1 reading' })
  @ArrayMaxSize(MAX_BATCH, { message: `readings must hold at most ${MAX_BATCH} readings a request` })
  readings: ReadingInput[];
}

export class ExcludeReadingDto implements ExcludeReadingRequest {
  @IsString({ message: 'reason must be text' })
  @Trim()
  @MinLength(FIELD_LIMITS.reading.excludeReason.min, { message: `reason must be at least ${FIELD_LIMITS.reading.excludeReason.min} characters` })
  @MaxLength(FIELD_LIMITS.reading.excludeReason.max, { message: `reason must be at most ${FIELD_LIMITS.reading.excludeReason.max} characters` })
  reason: string;
}

export class ListReadingsQueryDto implements ListReadingsQuery {
  // The same bounds as every other list (ListQueryDto): ?page=1e20 was a SQL error here too.
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
  @QueryBoolean()
  @IsBoolean({ message: 'excluded must be true or false' })
  excluded?: boolean;
}
