import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { LoginThrottlerModule } from '../accounts/login-throttle.js';
import { ClockModule } from '../common/clock.js';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { QuotaAccountFacts } from '../quotas/quota-account-facts.js';
import { QuotasModule } from '../quotas/quotas.module.js';
import { ApiTokenAuthenticator } from '../tokens/api-token.authenticator.js';
import { TokensModule } from '../tokens/tokens.module.js';
import { UsersModule } from '../users/users.module.js';
import { AccessGuard } from './access.guard.js';
import { AuthController } from './auth.controller.js';
import { AuthService } from './auth.service.js';
import { JwtStrategy } from './jwt.strategy.js';
import { AccountFacts, MeService } from './me.service.js';
import { PasswordHasher } from './password-hasher.js';
import { TokenAuthenticator } from './token-authenticator.js';

@Module({
  imports: [
    PassportModule,
    LoginThrottlerModule,
    TokensModule,
    QuotasModule,
    UsersModule,
    ClockModule,
    JwtModule.registerAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => ({
        secret: config.jwtSecret,
        signOptions: { expiresIn: config.jwtExpiresIn as never },
      }),
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService,
    PasswordHasher,
    JwtStrategy,
    MeService,
    // Bound to the tokens' and quotas' own providers, from the modules imported above.
    { provide: TokenAuthenticator, useExisting: ApiTokenAuthenticator },
    { provide: AccountFacts, useExisting: QuotaAccountFacts },
    { provide: APP_GUARD, useClass: AccessGuard },
  ],
  exports: [AuthService, PasswordHasher, JwtModule],
})
export class AuthModule {}
