import { ValidateBy, type ValidationOptions } from 'class-validator';
import { isSingleLineText, singleLineMessage } from '@kilocycle/common/text';

/**
 * A single-line text field (name, make, model, serial, asset tag, label, number, e-mail): refuses control
 * characters, line breaks and tabs included, with a 400 naming the field (common's rule and message).
 * Values that are not strings are left to @IsString and friends; with `{ each: true }` every item is checked.
 */
export function SingleLine(options?: ValidationOptions): PropertyDecorator {
  return ValidateBy(
    {
      name: 'singleLine',
      validator: {
        validate: (value: unknown) => typeof value !== 'string' || isSingleLineText(value),
        defaultMessage: (args) => singleLineMessage(args?.property ?? 'the text'),
      },
    },
    options,
  );
}
