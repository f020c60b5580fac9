import { Module } from '@nestjs/common';
import { AuthModule } from '../auth/auth.module.js';
import { SeedService } from './seed.service.js';

@Module({ imports: [AuthModule], providers: [SeedService], exports: [SeedService] })
export class SeedModule {}
