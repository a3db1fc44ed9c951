import { IsIn, IsOptional, IsString, Matches, MaxLength } from 'class-validator';
import { IMPORT_MODES, type ImportMode } from '@kilocycle/common/types';

/** Query of POST /api/runs/:id/imports; `mapping` may also come as a multipart field. */
export class ImportQueryDto {
  @IsOptional() @IsIn(IMPORT_MODES, { message: `mode must be one of: ${IMPORT_MODES.join(', ')}` })
  mode?: ImportMode;

  /** Chosen by the page so it can poll the progress while uploading; a random one otherwise. */
  @IsOptional() @IsString() @Matches(/^[A-Za-z0-9_-]{8,64}$/, { message: 'importId must be 8 to 64 letters, digits, - or _' })
  importId?: string;

  /** JSON: {"time":"Col A","dial":"Col B","frequency":"Col C","unit":"Col D","aux":"Col E"} (header names or column numbers from 1). */
  @IsOptional() @IsString() @MaxLength(2000)
  mapping?: string;
}
