import { Global, Module } from '@nestjs/common';
import { ApiTokenAuthenticator } from './api-token.authenticator.js';
import { TokensController } from './tokens.controller.js';
import { TokensRepository } from './tokens.repository.js';
import { TokensService } from './tokens.service.js';

/** Global so the auth module can bind ApiTokenAuthenticator (it needs TokensRepository). */
@Global()
@Module({
  controllers: [TokensController],
  providers: [TokensRepository, TokensService, ApiTokenAuthenticator],
  exports: [TokensRepository, ApiTokenAuthenticator],
})
export class TokensModule {}
