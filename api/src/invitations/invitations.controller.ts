import { Controller, HttpCode, Post, UseGuards } from '@nestjs/common';
import { ApiTags, ApiTooManyRequestsResponse } from '@nestjs/swagger';
import {
  forgotPasswordSchema,
  linkTokenInputSchema,
  setPasswordSchema,
  submitConsentSchema,
  type AccountMessage,
  type ConsentRequest,
  type ForgotPasswordInput,
  type LinkInfo,
  type LinkTokenInput,
  type SetPasswordInput,
  type SubmitConsentInput,
} from '@stavemark/shared';
import { PublicRoute } from '../auth/auth.decorators.js';
import { ValidBody } from '../common/validation.js';
import { InvitationsService } from './invitations.service.js';
import { LinkThrottlerGuard } from './link-throttler.guard.js';

/**
 * The pages behind e-mailed links. Public (the person has no password yet) and rate-limited;
 * tokens travel in the body, never in a URL that could be logged.
 */
@ApiTags('account links')
@Controller('account')
@UseGuards(LinkThrottlerGuard)
@ApiTooManyRequestsResponse({ description: 'Too many requests; see Retry-After.' })
export class InvitationsController {
  constructor(private readonly invitations: InvitationsService) {}

  @Post('link')
  @HttpCode(200)
  @PublicRoute(
    'What an e-mailed link is for',
    'Whom it greets and when it expires; 400 when it is unknown, used or expired.',
  )
  linkInfo(@ValidBody(linkTokenInputSchema) body: LinkTokenInput): Promise<LinkInfo> {
    return this.invitations.linkInfo(body.token);
  }

  @Post('accept-invitation')
  @HttpCode(200)
  @PublicRoute(
    'Accept an invitation by choosing a first password',
    'The link works once; older sessions are revoked.',
  )
  acceptInvitation(@ValidBody(setPasswordSchema) body: SetPasswordInput): Promise<AccountMessage> {
    return this.invitations.setPassword(body, 'invitation');
  }

  @Post('forgot-password')
  @HttpCode(202)
  @PublicRoute(
    'Ask for a password reset link',
    'Answers the same whether or not the address has an account.',
  )
  forgotPassword(
    @ValidBody(forgotPasswordSchema) body: ForgotPasswordInput,
  ): Promise<AccountMessage> {
    return this.invitations.forgotPassword(body);
  }

  @Post('reset-password')
  @HttpCode(200)
  @PublicRoute(
    'Choose a new password through a reset link',
    'The link works once; every older session is revoked.',
  )
  resetPassword(@ValidBody(setPasswordSchema) body: SetPasswordInput): Promise<AccountMessage> {
    return this.invitations.setPassword(body, 'password_reset');
  }

  @Post('consent/request')
  @HttpCode(200)
  @PublicRoute(
    'What a guardian’s consent link asks',
    'The guardian’s children in the school and their current answers.',
  )
  consentRequest(@ValidBody(linkTokenInputSchema) body: LinkTokenInput): Promise<ConsentRequest> {
    return this.invitations.consentRequest(body.token);
  }

  @Post('consent')
  @HttpCode(200)
  @PublicRoute(
    'A guardian’s answers: results by e-mail, recordings',
    'One answer pair per child; the link works once.',
  )
  submitConsent(@ValidBody(submitConsentSchema) body: SubmitConsentInput): Promise<AccountMessage> {
    return this.invitations.submitConsent(body);
  }
}
