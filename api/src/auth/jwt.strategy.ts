import { createSecretKey } from 'node:crypto';
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
      // A KeyObject, not the string: given a string, jsonwebtoken first tries it as a PEM public
      // key on every verify and builds the secret key from the failure (measured: about a fifth
      // of the API's CPU under the marking-saves bench). Same HS256 key, made once. The typings
      // say string | Buffer; passport-jwt hands the value to jsonwebtoken unchanged.
      secretOrKey: createSecretKey(Buffer.from(env.JWT_SECRET, 'utf8')) as unknown as Buffer,
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
