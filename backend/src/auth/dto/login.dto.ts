import { IsEmail, IsString, MaxLength } from 'class-validator';
import type { LoginRequest } from '@kilocycle/common/types';

export class LoginDto implements LoginRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  email: string;

  @IsString()
  @MaxLength(200)
  password: string;
}
