import { IsEmail, IsString, MaxLength } from 'class-validator';
import type { LoginRequest } from '@kilocycle/common/types';
import { SingleLine } from '../../shared/single-line.decorator.js';

export class LoginDto implements LoginRequest {
  @IsEmail({}, { message: 'email must be an e-mail address' })
  @MaxLength(254)
  @SingleLine()
  email: string;

  @IsString()
  @MaxLength(200)
  password: string;
}
