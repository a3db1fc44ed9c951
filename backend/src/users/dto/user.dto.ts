import { FIELD_LIMITS } from '@kilocycle/common/rules';
import { OmitType } from '@nestjs/mapped-types';
import { Transform, Type } from 'class-transformer';
import { IsBoolean, IsEmail, IsIn, IsInt, IsOptional, IsString, MaxLength, Min, MinLength } from 'class-validator';
import { MIN_PASSWORD_LENGTH, ROLES, type CreateUserRequest, type Role, type UpdateUserRequest } from '@kilocycle/common/types';
import { ListQueryDto } from '../../shared/list-query.dto.js';
import { SingleLine } from '../../shared/single-line.decorator.js';
import { OptionalNotNull } from '../../shared/optional-not-null.decorator.js';
import { PartialUpdateType } from '../../shared/partial-update-type.js';

const passwordMessage = `password must be at least ${MIN_PASSWORD_LENGTH} characters`;

export class CreateUserDto implements CreateUserRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(FIELD_LIMITS.user.email.max)
  @Transform(({ value }) => (typeof value === 'string' ? value.trim().toLowerCase() : value))
  @SingleLine()
  email: string;

  @IsString()
  @MinLength(1)
  @MaxLength(FIELD_LIMITS.user.name.max)
  @SingleLine()
  name: string;

  @IsIn(ROLES, { message: `role must be one of: ${ROLES.join(', ')}` })
  role: Role;

  @IsInt()
  @Min(1)
  organizationId: number;

  @IsString()
  @MinLength(MIN_PASSWORD_LENGTH, { message: passwordMessage })
  @MaxLength(FIELD_LIMITS.user.password.max)
  password: string;
}

export class UpdateUserDto extends PartialUpdateType(OmitType(CreateUserDto, ['email', 'organizationId'] as const)) implements UpdateUserRequest {
  @OptionalNotNull()
  @IsBoolean()
  active?: boolean;
}

export class ListUsersQueryDto extends ListQueryDto {
  @IsOptional()
  @IsIn(ROLES)
  role?: Role;

  @IsOptional()
  @Type(() => Number)
  @IsInt()
  organizationId?: number;

  @IsOptional()
  @Transform(({ value }) => (value === 'true' ? true : value === 'false' ? false : value))
  @IsBoolean()
  active?: boolean;
}
