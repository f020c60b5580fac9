import { Module } from '@nestjs/common';
import { ClockModule } from '../common/clock.js';
import { ApiTokenAuthenticator } from './api-token.authenticator.js';
import { TokensController } from './tokens.controller.js';
import { TokensRepository } from './tokens.repository.js';
import { TokensService } from './tokens.service.js';

/** API tokens; imported by the auth module (ApiTokenAuthenticator) and accounts (revoking on password change). */
@Module({
  imports: [ClockModule],
  controllers: [TokensController],
  providers: [TokensRepository, TokensService, ApiTokenAuthenticator],
  exports: [TokensRepository, ApiTokenAuthenticator],
})
export class TokensModule {}
