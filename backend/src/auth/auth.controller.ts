import { Body, Controller, Get, HttpCode, Ip, Post, UseInterceptors } from '@nestjs/common';
import { ApiBearerAuth, ApiTags } from '@nestjs/swagger';
import type { LoginResponse, SessionUser } from '@kilocycle/common/types';
import type { AuthUser } from '../shared/auth-user.js';
import { AuthService } from './auth.service.js';
import { CurrentUser, Public } from '../shared/decorators.js';
import { LoginDto } from './dto/login.dto.js';
import { RetryAfterInterceptor } from '../shared/too-many-attempts.js';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(private readonly auth: AuthService) {}

  @Public()
  @Post('login')
  @HttpCode(200)
  @UseInterceptors(RetryAfterInterceptor)
  login(@Body() body: LoginDto, @Ip() address: string): Promise<LoginResponse> {
    return this.auth.login(body.email, body.password, address);
  }

  @ApiBearerAuth()
  @Get('me')
  me(@CurrentUser() user: AuthUser): SessionUser {
    const { jti: _jti, exp: _exp, ...session } = user;
    return session;
  }

  @ApiBearerAuth()
  @Post('logout')
  @HttpCode(204)
  async logout(@CurrentUser() user: AuthUser, @Ip() address: string): Promise<void> {
    await this.auth.logout(user, address);
  }
}
