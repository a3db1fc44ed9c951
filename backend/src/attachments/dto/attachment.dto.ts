import { IsBoolean, IsOptional } from 'class-validator';
import { QueryBoolean } from '../../shared/dto-helpers.js';

export class ServeAttachmentQueryDto {
  /** true: Content-Disposition attachment (save), else inline (show). */
  @IsOptional()
  @QueryBoolean()
  @IsBoolean({ message: 'download must be true or false' })
  download?: boolean;
}
