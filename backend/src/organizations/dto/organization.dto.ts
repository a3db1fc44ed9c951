import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { OmitType } from '@nestjs/mapped-types';
import { Transform } from 'class-transformer';
import { IsBoolean, IsEmail, IsIn, IsOptional, IsString, MaxLength, MinLength, ValidateIf } from 'class-validator';
import { ORGANIZATION_KINDS, type CreateOrganizationRequest, type OrganizationKind, type UpdateOrganizationRequest } from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

export class CreateOrganizationDto implements CreateOrganizationRequest {
  @IsString()
  @Transform(({ value }) => (typeof value === 'string' ? value.trim() : value))
  @MinLength(1, { message: 'name must not be empty' })
  @MaxLength(FIELD_LIMITS.organization.name.max)
  @SingleLine()
  name: string;

  @IsIn(ORGANIZATION_KINDS, { message: `kind must be one of: ${ORGANIZATION_KINDS.join(', ')}` })
  kind: OrganizationKind;

  @IsOptional()
  @ValidateIf((_o, v) => v !== null)
  @IsEmail({}, { message: 'contactEmail must be an e-mail address' })
  @SingleLine()
  contactEmail?: string | null;
}

export class UpdateOrganizationDto extends PartialUpdateType(OmitType(CreateOrganizationDto, ['kind'] as const)) implements UpdateOrganizationRequest {
  @OptionalNotNull()
  @IsBoolean()
  active?: boolean;
}

export class ListOrganizationsQueryDto extends ListQueryDto {
  @IsOptional()
  @IsIn(ORGANIZATION_KINDS)
  kind?: OrganizationKind;

  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  active?: boolean;
}
