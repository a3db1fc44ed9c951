import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { Transform } from 'class-transformer';
import { IsString, MaxLength, MinLength } from 'class-validator';
import type { ReturnJobRequest, SignJobRequest, SubmitJobRequest } from '@kilocycle/common/types';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';

const trim = () => Transform(({ value }) => (typeof value === 'string' ? value.trim() : value));

export class SubmitJobDto implements SubmitJobRequest {
  @OptionalNotNull() @IsString() @trim() @MaxLength(FIELD_LIMITS.review.submitComment.max) comment?: string;
}

export class ReturnJobDto implements ReturnJobRequest {
  @IsString()
  @trim()
  @MinLength(FIELD_LIMITS.review.returnComment.min, { message: 'comment: say what needs rework' })
  @MaxLength(FIELD_LIMITS.review.returnComment.max)
  comment: string;
}

export class SignJobDto implements SignJobRequest {
  @IsString()
  @MinLength(1, { message: 'password: enter your password to sign' })
  @MaxLength(FIELD_LIMITS.review.password.max)
  password: string;

  @IsString()
  @trim()
  @MaxLength(200)
  @SingleLine()
  meaning: string;
}
