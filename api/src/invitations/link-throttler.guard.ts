import { Inject, Injectable, type ExecutionContext } from '@nestjs/common';
import {
  ThrottlerException,
  ThrottlerGuard,
  type ThrottlerLimitDetail,
  type ThrottlerRequest,
} from '@nestjs/throttler';
import type { Request, Response } from 'express';
import { ENV } from '../config/config.module.js';
import type { Env } from '../config/env.js';

/**
 * Limits for the public link routes (forgot password, set a password, consent), after the sign-in
 * guard's pattern: per client and e-mail ("email", forgot password) and per client ("client", every
 * link route), counted per route and apart from sign-in, with their own limits from the environment. Answers 429 with Retry-After.
 */
@Injectable()
export class LinkThrottlerGuard extends ThrottlerGuard {
  @Inject(ENV) private readonly env!: Env;

  protected override async handleRequest(props: ThrottlerRequest): Promise<boolean> {
    const perEmail = props.throttler.name === 'email';
    if (perEmail && this.emailOf(props.context) === '') return true; // token routes: per client only
    return super.handleRequest({
      ...props,
      limit: perEmail ? this.env.LINK_LIMIT_PER_EMAIL : this.env.LINK_LIMIT_PER_CLIENT,
      ttl: this.env.LINK_LIMIT_WINDOW_SECONDS * 1000,
      blockDuration: this.env.LINK_LIMIT_WINDOW_SECONDS * 1000,
    });
  }

  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const r = req as unknown as Request;
    return r.ip ?? r.socket.remoteAddress ?? 'unknown';
  }

  protected override generateKey(
    context: ExecutionContext,
    tracker: string,
    throttlerName: string,
  ): string {
    const route = `link:${context.getHandler().name}`;
    if (throttlerName !== 'email') return `${route}:client:${tracker}`;
    return `${route}:email:${tracker}:${this.emailOf(context)}`;
  }

  private emailOf(context: ExecutionContext): string {
    const body = context.switchToHttp().getRequest<Request>().body as
      { email?: unknown } | undefined;
    return typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
  }

  protected override async throwThrottlingException(
    context: ExecutionContext,
    detail: ThrottlerLimitDetail,
  ): Promise<void> {
    const res = context.switchToHttp().getResponse<Response>();
    const wait = Math.max(1, Math.ceil(detail.timeToBlockExpire));
    res.setHeader('Retry-After', String(wait));
    const minutes = Math.ceil(wait / 60);
    throw new ThrottlerException(
      `Too many requests from here for now. Please wait ${wait < 120 ? `${wait} seconds` : `${minutes} minutes`} and try again.`,
    );
  }
}
