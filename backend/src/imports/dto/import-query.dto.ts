import { IsBoolean, IsIn, IsOptional, IsString, Matches, MaxLength } from 'class-validator';
import { IMPORT_MODES, type ImportMode, type ImportQuery } from '@kilocycle/common/types';
import { QueryBoolean } from '../../shared/dto-helpers.js';

/** Query of POST /api/runs/:id/imports; `mapping` may also come as a multipart field. */
export class ImportQueryDto implements ImportQuery {
  @IsOptional()
  @IsIn(IMPORT_MODES, { message: `mode must be one of: ${IMPORT_MODES.join(', ')}` })
  mode?: ImportMode;

  /** Chosen by the page so it can poll the progress while uploading; a random one otherwise. */
  @IsOptional()
  @IsString()
  @Matches(/^[A-Za-z0-9_-]{8,64}$/, { message: 'importId must be 8 to 64 letters, digits, - or _' })
  importId?: string;

  /** JSON: {"time":"Col A","dial":"Col B","frequency":"Col C","unit":"Col D","aux":"Col E"} (header names or column numbers from 1). */
  @IsOptional()
  @IsString()
  @MaxLength(2000)
  mapping?: string;

  /** true: rows outside the range's span (by more than 10 % of it) are stored as given instead of refused. */
  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'confirmed must be true or false' })
  confirmed?: boolean;
}
