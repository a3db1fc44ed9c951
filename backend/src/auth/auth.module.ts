import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { TypeOrmModule } from '@nestjs/typeorm';
import { APP_CONFIG, type AppConfig } from '../config/config.module.js';
import { UsersModule } from '../users/users.module.js';
import { AuthController } from './auth.controller.js';
import { AuthGuard } from './auth.guard.js';
import { AuthService } from './auth.service.js';
import { RevokedToken } from './revoked-token.entity.js';
import { SignInThrottleModule } from './sign-in-throttle.module.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([RevokedToken]),
    UsersModule,
    SignInThrottleModule,
    JwtModule.registerAsync({
      inject: [APP_CONFIG],
      // The algorithm is pinned both ways: a token signed with any other (HS512, none) is refused.
      useFactory: (config: AppConfig) => ({
        secret: config.jwtSecret,
        signOptions: { algorithm: 'HS256' },
        verifyOptions: { algorithms: ['HS256'] },
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [AuthService, { provide: APP_GUARD, useClass: AuthGuard }],
  exports: [AuthService],
})
export class AuthModule {}
