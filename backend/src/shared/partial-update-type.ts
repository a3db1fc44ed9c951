import { PartialType } from '@nestjs/mapped-types';
import type { Type } from '@nestjs/common';
import { IS_OPTIONAL, IsDefined, ValidationTypes, getMetadataStorage } from 'class-validator';

/**
 * The Update DTO of a Create DTO: `PartialType` with every rule and message of the Create DTO kept.
 * A field left out is not checked; a field sent is checked as on create. Null is checked too
 * (`skipNullProperties: false`): a field the Create DTO marks `@IsOptional()` (a nullable column)
 * still takes null, and any other field answers 400 "<field> must not be null", as `@OptionalNotNull()`
 * does, instead of letting null through to a NOT NULL column.
 */
export function PartialUpdateType<T>(classRef: Type<T>): Type<Partial<T>> {
  const partial = PartialType(classRef, { skipNullProperties: false });
  const metadata = getMetadataStorage().getTargetValidationMetadatas(classRef, '', true, false);
  const has = (property: string, test: (m: (typeof metadata)[number]) => boolean) => metadata.some((m) => m.propertyName === property && test(m));
  const properties = new Set(metadata.map((m) => m.propertyName));
  for (const property of properties) {
    const nullable = has(property, (m) => m.type === ValidationTypes.CONDITIONAL_VALIDATION && m.name === IS_OPTIONAL);
    const refusesNull = has(property, (m) => m.type === ValidationTypes.IS_DEFINED);
    if (!nullable && !refusesNull) IsDefined({ message: '$property must not be null' })(partial.prototype as object, property);
  }
  return partial;
}
