import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module.js';
import { ClockModule } from '../common/clock.js';
import { UsersModule } from '../users/users.module.js';
import { SeedService } from './seed.service.js';

@Module({ imports: [AuthModule, UsersModule, ClockModule], providers: [SeedService], exports: [SeedService] })
export class SeedModule {}
