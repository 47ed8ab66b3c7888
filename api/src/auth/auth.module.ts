import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import { Membership } from '../users/entities/membership.entity.js';
import { Person } from '../users/entities/person.entity.js';
import { AuthController } from './auth.controller.js';
import { AuthGuard } from './auth.guard.js';
import { AuthService } from './auth.service.js';
import { RefreshToken } from './entities/refresh-token.entity.js';
import { JwtStrategy } from './jwt.strategy.js';
import { LoginThrottlerGuard } from './login-throttler.guard.js';
import { TokenService } from './token.service.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Person, Membership, RefreshToken]),
    PassportModule,
    JwtModule.registerAsync({
      inject: [ENV],
      useFactory: (env: Env) => ({ secret: env.JWT_SECRET, signOptions: { algorithm: 'HS256' } }),
    }),
    // In memory for one instance; design.md §11 moves this storage to Redis for several.
    ThrottlerModule.forRootAsync({
      inject: [ENV],
      useFactory: (env: Env) => [
        { name: 'email', ttl: env.LOGIN_LIMIT_WINDOW_SECONDS * 1000, limit: env.LOGIN_LIMIT_PER_EMAIL },
        { name: 'client', ttl: env.LOGIN_LIMIT_WINDOW_SECONDS * 1000, limit: env.LOGIN_LIMIT_PER_CLIENT },
      ],
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    TokenService,
    JwtStrategy,
    LoginThrottlerGuard,
    { provide: APP_GUARD, useClass: AuthGuard },
  ],
  exports: [TokenService],
})
export class AuthModule {}
