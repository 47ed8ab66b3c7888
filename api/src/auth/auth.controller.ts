import { Controller, Get, HttpCode, Inject, Patch, Post, Req, Res, UseGuards } from '@nestjs/common';
import { ApiTags, ApiTooManyRequestsResponse } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { z } from 'zod';
import {
  loginSchema,
  noteNameConventionSchema,
  switchOrganisationSchema,
  type AuthSession,
  type CurrentUser,
  type LoginInput,
  type SwitchOrganisationInput,
} from '@stavemark/shared';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';
import type { Caller } from '../common/request-context.js';
import { ValidBody } from '../common/validation.js';
import { CurrentCaller, PublicRoute, Route } from './auth.decorators.js';
import { AuthService, type SessionWithRefresh } from './auth.service.js';
import { LoginThrottlerGuard } from './login-throttler.guard.js';

export const REFRESH_COOKIE = 'stavemark_refresh';

const updateMeSchema = z.strictObject({
  displayName: z.string().trim().min(1).max(120).optional(),
  noteNames: noteNameConventionSchema.optional(),
});

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    @Inject(ENV) private readonly env: Env,
  ) {}

  @Post('login')
  @HttpCode(200)
  @UseGuards(LoginThrottlerGuard)
  @PublicRoute('Sign in', 'Returns an access token and sets the rotating refresh cookie.')
  @ApiTooManyRequestsResponse({ description: 'Too many attempts; see Retry-After.' })
  async login(@ValidBody(loginSchema) body: LoginInput, @Res({ passthrough: true }) res: Response): Promise<AuthSession> {
    return this.withCookie(res, await this.auth.login(body));
  }

  @Post('refresh')
  @HttpCode(200)
  @PublicRoute('Exchange the refresh cookie for a new access token', 'The cookie rotates on every use.')
  async refresh(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<AuthSession> {
    try {
      return this.withCookie(res, await this.auth.refresh(this.cookieOf(req)));
    } catch (e) {
      this.clearCookie(res);
      throw e;
    }
  }

  @Post('logout')
  @HttpCode(204)
  @PublicRoute('Sign out', 'Revokes the refresh token family and clears the cookie.')
  async logout(@Req() req: Request, @Res({ passthrough: true }) res: Response): Promise<void> {
    await this.auth.logout(this.cookieOf(req));
    this.clearCookie(res);
  }

  @Get('me')
  @Route({ summary: 'The signed-in person with their memberships' })
  me(@CurrentCaller() caller: Caller): Promise<CurrentUser> {
    return this.auth.me(caller.personId, caller.organisationId);
  }

  @Patch('me')
  @Route({ summary: 'Change own display name or note-value names (British or American)' })
  updateMe(@CurrentCaller() caller: Caller, @ValidBody(updateMeSchema) body: z.infer<typeof updateMeSchema>): Promise<CurrentUser> {
    return this.auth.updateMe(caller.personId, caller.organisationId, body);
  }

  @Post('switch-organisation')
  @HttpCode(200)
  @Route({ summary: 'Work in another of your organisations', description: 'Returns a session scoped to it.' })
  async switchOrganisation(
    @CurrentCaller() caller: Caller,
    @ValidBody(switchOrganisationSchema) body: SwitchOrganisationInput,
    @Res({ passthrough: true }) res: Response,
  ): Promise<AuthSession> {
    return this.withCookie(res, await this.auth.switchOrganisation(caller.personId, body.organisationId));
  }

  private cookieOf(req: Request): string | undefined {
    const v = (req.cookies as Record<string, string> | undefined)?.[REFRESH_COOKIE];
    return typeof v === 'string' && v.length > 0 ? v : undefined;
  }

  private withCookie(res: Response, s: SessionWithRefresh): AuthSession {
    res.cookie(REFRESH_COOKIE, s.refreshToken, {
      httpOnly: true,
      sameSite: 'strict',
      secure: this.env.NODE_ENV === 'production',
      path: '/api/auth',
      expires: s.refreshExpiresAt,
    });
    res.setHeader('Cache-Control', 'no-store');
    return s.session;
  }

  private clearCookie(res: Response): void {
    res.clearCookie(REFRESH_COOKIE, { path: '/api/auth', httpOnly: true, sameSite: 'strict' });
  }
}
