import { Body, Controller, Get, HttpCode, Post, UseGuards } from '@nestjs/common';
import { ApiBearerAuth, ApiBody, ApiOperation, ApiTags } from '@nestjs/swagger';
import { loginRequestSchema, type LoginRequest } from '@driftgrid/domain';
import { LoginThrottleGuard } from '../accounts/login-throttle.js';
import { ZodValidationPipe } from '../common/zod-validation.pipe.js';
import { openApiSchema } from '../common/openapi.js';
import { Public, SignedIn } from './access.decorators.js';
import { AuthService } from './auth.service.js';
import { MeService } from './me.service.js';
import { CurrentUser, type AuthUser } from './current-user.js';

@ApiTags('auth')
@Controller('auth')
export class AuthController {
  constructor(
    private readonly auth: AuthService,
    private readonly me: MeService,
  ) {}

  @Post('login')
  @Public()
  @HttpCode(200)
  @UseGuards(LoginThrottleGuard)
  @ApiOperation({ summary: 'Sign in with e-mail and password; returns a bearer token' })
  @ApiBody({ schema: openApiSchema(loginRequestSchema) })
  login(@Body(new ZodValidationPipe(loginRequestSchema)) body: LoginRequest) {
    return this.auth.login(body);
  }

  @Get('me')
  @SignedIn()
  @ApiBearerAuth()
  @ApiOperation({ summary: 'The signed-in user with quotas and usage' })
  getMe(@CurrentUser() user: AuthUser) {
    return this.me.describe(user);
  }
}
