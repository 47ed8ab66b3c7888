import { Inject, Injectable } from '@nestjs/common';
import { PassportStrategy } from '@nestjs/passport';
import { ExtractJwt, Strategy } from 'passport-jwt';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import type { Caller } from '../common/request-context.js';
import { unauthenticated } from '../common/errors.js';
import { TokenService, type AccessPayload } from './token.service.js';

@Injectable()
export class JwtStrategy extends PassportStrategy(Strategy, 'jwt') {
  constructor(
    @Inject(ENV) env: Env,
    private readonly tokens: TokenService,
  ) {
    super({
      jwtFromRequest: ExtractJwt.fromAuthHeaderAsBearerToken(),
      secretOrKey: env.JWT_SECRET,
      algorithms: ['HS256'],
      ignoreExpiration: false,
    });
  }

  async validate(payload: AccessPayload): Promise<Caller> {
    const caller = await this.tokens.callerFor(payload);
    if (!caller) throw unauthenticated('Your session has ended; please sign in again.');
    return caller;
  }
}
