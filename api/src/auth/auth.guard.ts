import { Injectable, ServiceUnavailableException, type ExecutionContext } from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import { AuthGuard as PassportAuthGuard } from '@nestjs/passport';
import type { Request } from 'express';
import type { Role } from '@stavemark/shared';
import { DomainError, forbidden, unauthenticated } from '../common/errors.js';
import { RequestContext, type Caller } from '../common/request-context.js';
import { IS_PUBLIC, ROLES_KEY } from './auth.decorators.js';

/**
 * Registered globally (APP_GUARD), so a new route is protected even when nobody remembers to.
 * passport-jwt checks the token; the strategy checks the token version and the active
 * membership in the token's organisation (deactivation takes effect at once); then the roles.
 */
@Injectable()
export class AuthGuard extends PassportAuthGuard('jwt') {
  constructor(private readonly reflector: Reflector) {
    super();
  }

  override async canActivate(context: ExecutionContext): Promise<boolean> {
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC, targets)) return true;

    await super.canActivate(context);
    const req = context.switchToHttp().getRequest<Request & { user?: Caller; caller?: Caller }>();
    const caller = req.user;
    if (!caller) throw unauthenticated();
    req.caller = caller;
    RequestContext.setCaller(caller);

    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, targets);
    if (roles && !roles.some((r) => caller.roles.includes(r))) throw forbidden();
    return true;
  }

  override handleRequest<TUser = Caller>(err: unknown, user: TUser | false, info: unknown): TUser {
    if (err instanceof DomainError) throw err;
    // The token was good but checking it failed (e.g. the database pool timed out): answer 503 so
    // clients retry, rather than 401, which would sign an examiner out mid-slot.
    if (err) throw new ServiceUnavailableException('Your session could not be checked just now; please try again in a moment.');
    if (!user) {
      const expired = info instanceof Error && info.name === 'TokenExpiredError';
      throw unauthenticated(expired ? 'Your access token has expired; refresh it or sign in again.' : 'Please sign in.');
    }
    return user;
  }
}
