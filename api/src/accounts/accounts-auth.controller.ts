import { Body, Controller, HttpCode, Post, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import {
  acceptInviteSchema,
  changePasswordSchema,
  passwordResetConfirmSchema,
  passwordResetRequestSchema,
  type AcceptInviteRequest,
  type ChangePasswordRequest,
  type PasswordResetConfirm,
  type PasswordResetRequest,
} from '@driftgrid/domain';
import { Public, SignedIn } from '../auth/access.decorators.js';
import { CurrentUser, type AuthUser } from '../auth/current-user.js';
import { openApiSchema } from '../common/openapi.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { InvitationsService } from './invitations.service.js';
import { LoginThrottleGuard } from './login-throttle.js';
import { PasswordChangeService } from './password-change.service.js';

/** Account routes under /api/auth: accept an invitation, reset and change the password. */
@ApiTags('auth')
@Controller('auth')
export class AccountsAuthController {
  constructor(
    private readonly invitations: InvitationsService,
    private readonly passwordChanges: PasswordChangeService,
  ) {}

  @Post('accept-invite')
  @Public()
  @HttpCode(200)
  @UseGuards(LoginThrottleGuard)
  @ApiOperation({ summary: 'Accept an invitation: choose a name and password; returns a sign-in like login' })
  @ApiBody({ schema: openApiSchema(acceptInviteSchema) })
  accept(@Body(new ZodValidationPipe(acceptInviteSchema)) body: AcceptInviteRequest) {
    return this.invitations.accept(body);
  }

  @Post('password-reset')
  @Public()
  @HttpCode(202)
  @UseGuards(LoginThrottleGuard)
  @ApiOperation({ summary: 'Mail a reset link; the same answer whether or not the address has an account' })
  @ApiBody({ schema: openApiSchema(passwordResetRequestSchema) })
  requestReset(@Body(new ZodValidationPipe(passwordResetRequestSchema)) body: PasswordResetRequest) {
    return this.passwordChanges.requestReset(body);
  }

  @Post('password-reset/confirm')
  @Public()
  @HttpCode(200)
  @UseGuards(LoginThrottleGuard)
  @ApiOperation({ summary: 'Set a new password with the token from the reset link' })
  @ApiBody({ schema: openApiSchema(passwordResetConfirmSchema) })
  confirmReset(@Body(new ZodValidationPipe(passwordResetConfirmSchema)) body: PasswordResetConfirm) {
    return this.passwordChanges.confirmReset(body);
  }

  @Post('password')
  @SignedIn()
  @HttpCode(200)
  @ApiBearerAuth()
  @ApiOperation({ summary: 'Change your password (needs the current one)' })
  @ApiBody({ schema: openApiSchema(changePasswordSchema) })
  change(
    @CurrentUser() user: AuthUser,
    @Body(new ZodValidationPipe(changePasswordSchema)) body: ChangePasswordRequest,
  ) {
    return this.passwordChanges.change(user, body);
  }
}
