import { Injectable, type ExecutionContext } from '@nestjs/common';
import { ThrottlerGuard, ThrottlerException, type ThrottlerLimitDetail } from '@nestjs/throttler';
import type { Request, Response } from 'express';

/**
 * Sign-in limits: one throttler per client address and e-mail ("email"), and a looser one per
 * client address ("client"). Answers 429 with Retry-After in seconds.
 */
@Injectable()
export class LoginThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    const r = req as unknown as Request;
    return r.ip ?? r.socket.remoteAddress ?? 'unknown';
  }

  protected override generateKey(context: ExecutionContext, tracker: string, throttlerName: string): string {
    if (throttlerName !== 'email') return `${throttlerName}:${tracker}`;
    const body = context.switchToHttp().getRequest<Request>().body as { email?: unknown } | undefined;
    const email = typeof body?.email === 'string' ? body.email.trim().toLowerCase() : '';
    return `email:${tracker}:${email}`;
  }

  protected override async throwThrottlingException(
    context: ExecutionContext,
    detail: ThrottlerLimitDetail,
  ): Promise<void> {
    const res = context.switchToHttp().getResponse<Response>();
    const wait = Math.max(1, Math.ceil(detail.timeToBlockExpire));
    res.setHeader('Retry-After', String(wait));
    throw new ThrottlerException(`Too many sign-in attempts. Please wait ${wait} seconds and try again.`);
  }
}
