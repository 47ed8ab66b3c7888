import { applyDecorators, createParamDecorator, SetMetadata, type ExecutionContext } from '@nestjs/common';
import { ApiBearerAuth, ApiForbiddenResponse, ApiNotFoundResponse, ApiOperation, ApiUnauthorizedResponse } from '@nestjs/swagger';
import type { Role } from '@stavemark/shared';
import type { Caller } from '../common/request-context.js';

export const IS_PUBLIC = 'stavemark:public';
export const ROLES_KEY = 'stavemark:roles';

export interface RouteOptions {
  summary: string;
  /** Roles that may call the route; omitted means any signed-in member. */
  roles?: Role[];
  description?: string;
  /** The route looks up one record: 404 when it is not the caller's to see. */
  owned?: boolean;
}

/** One decorator per route: who may call it and what the OpenAPI document says about it. */
export function Route(options: RouteOptions): MethodDecorator {
  const decorators = [
    ApiOperation({
      summary: options.summary,
      description: [options.description, options.roles ? `Roles: ${options.roles.join(', ')}.` : 'Any signed-in member.']
        .filter(Boolean)
        .join(' '),
    }),
    ApiBearerAuth(),
    ApiUnauthorizedResponse({ description: 'No valid access token.' }),
  ];
  if (options.roles) {
    decorators.push(SetMetadata(ROLES_KEY, options.roles), ApiForbiddenResponse({ description: 'Role not allowed.' }));
  }
  if (options.owned) decorators.push(ApiNotFoundResponse({ description: 'Not there, or not yours to see.' }));
  return applyDecorators(...decorators);
}

/** Opts a route out of the global guard (sign-in, health, refresh). */
export function PublicRoute(summary: string, description?: string): MethodDecorator {
  return applyDecorators(SetMetadata(IS_PUBLIC, true), ApiOperation({ summary, description }));
}

/** The caller the guard verified. */
export const CurrentCaller = createParamDecorator((_data: unknown, ctx: ExecutionContext): Caller => {
  const req = ctx.switchToHttp().getRequest<{ caller?: Caller }>();
  if (!req.caller) throw new Error('CurrentCaller used on a public route');
  return req.caller;
});
