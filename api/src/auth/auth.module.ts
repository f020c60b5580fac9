import { Module } from '@nestjs/common';
import { APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { APP_CONFIG, type AppConfig } from '../config/app-config.js';
import { AccessGuard } from './access.guard.js';
import { AuthController } from './auth.controller.js';
import { AuthService } from './auth.service.js';
import { JwtStrategy } from './jwt.strategy.js';
import { AccountFacts, MeService, NoAccountFacts } from './me.service.js';
import { PasswordService } from './password.service.js';
import { NoTokenAuthenticator, TokenAuthenticator } from './token-authenticator.js';

@Module({
  imports: [
    PassportModule,
    JwtModule.registerAsync({
      inject: [APP_CONFIG],
      useFactory: (config: AppConfig) => ({ secret: config.jwtSecret, signOptions: { expiresIn: config.jwtExpiresIn as never } }),
    }),
  ],
  controllers: [AuthController],
  providers: [
    AuthService, PasswordService, JwtStrategy, MeService,
    { provide: TokenAuthenticator, useClass: NoTokenAuthenticator },
    { provide: AccountFacts, useClass: NoAccountFacts },
    { provide: APP_GUARD, useClass: AccessGuard },
  ],
  exports: [AuthService, PasswordService, JwtModule],
})
export class AuthModule {}
