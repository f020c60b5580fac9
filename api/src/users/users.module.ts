import { Module } from '@nestjs/common';
import { UsersRepository } from './users.repository.js';

/** The users table; modules that look up or change accounts import it. */
@Module({ providers: [UsersRepository], exports: [UsersRepository] })
export class UsersModule {}
