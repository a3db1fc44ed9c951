import { applyDecorators } from '@nestjs/common';
import { IsDefined, ValidateIf } from 'class-validator';

/**
 * A field that may be left out but never sent as null: use instead of @IsOptional() wherever the
 * column behind it cannot be null (IsOptional lets null through to the database, a 500). Left out,
 * the field's other checks are skipped; null answers 400 "<field> must not be null".
 */
export const OptionalNotNull = () =>
  applyDecorators(
    ValidateIf((_object: object, value: unknown) => value !== undefined),
    IsDefined({ message: '$property must not be null' }),
  );
