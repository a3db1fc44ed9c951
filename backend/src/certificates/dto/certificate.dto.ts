import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { Transform, Type } from 'class-transformer';
import { IsBoolean, IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min, MinLength } from 'class-validator';
import type { AmendCertificateRequest, ListCertificatesQuery, UpdateCertificateSettingsRequest, WithdrawCertificateRequest } from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';

const trim = () => Transform(({ value }) => (typeof value === 'string' ? value.trim() : value));

export class ListCertificatesQueryDto extends ListQueryDto implements ListCertificatesQuery {
  @IsOptional() @Type(() => Number) @IsInt() @Min(1) organizationId?: number;
  @IsOptional() @Type(() => Number) @IsInt() @Min(1) instrumentId?: number;
  @IsOptional() @Type(() => Number) @IsInt() @Min(1) jobId?: number;

  @IsOptional()
  @IsString()
  @Matches(/^(draft|issued|superseded|withdrawn)(,(draft|issued|superseded|withdrawn))*$/, {
    message: 'status must be one or more of draft, issued, superseded, withdrawn, separated by commas',
  })
  status?: string;
}

export class AmendCertificateDto implements AmendCertificateRequest {
  @IsString()
  @trim()
  @MinLength(FIELD_LIMITS.certificate.reason.min, { message: 'reason: say why the certificate is amended' })
  @MaxLength(FIELD_LIMITS.certificate.reason.max)
  reason: string;

  @OptionalNotNull()
  @IsBoolean()
  rework?: boolean;
}

export class WithdrawCertificateDto implements WithdrawCertificateRequest {
  @IsString()
  @trim()
  @MinLength(FIELD_LIMITS.certificate.reason.min, { message: 'reason: say why the certificate is withdrawn' })
  @MaxLength(FIELD_LIMITS.certificate.reason.max)
  reason: string;
}

export class UpdateSettingsDto implements UpdateCertificateSettingsRequest {
  @OptionalNotNull() @IsBoolean() allowSelfSign?: boolean;

  @OptionalNotNull()
  @IsString()
  @Matches(/^[A-Z][A-Z0-9]{0,7}$/, { message: 'certificatePrefix must be 1 to 8 capital letters or digits, starting with a letter' })
  certificatePrefix?: string;

  @OptionalNotNull() @IsString() @trim() @MinLength(1) @MaxLength(500) labAddress?: string;
  @OptionalNotNull() @IsString() @trim() @MinLength(1) @MaxLength(300) @SingleLine() calibrationPlace?: string;
  @OptionalNotNull() @IsInt() @Min(1) @Max(365) recallNoticeDays?: number;
}
