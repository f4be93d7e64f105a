import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { SessionRow } from '../auth/session.entity';
import { AccountEvents } from './account-events';
import { DemoUsersSeeder } from './demo-users';
import { PasswordService } from './password.service';
import { UserRow } from './user.entity';
import { UsersController } from './users.controller';
import { UsersService } from './users.service';

/** Accounts and their passwords; the administrators' routes. */
@Module({
  imports: [TypeOrmModule.forFeature([UserRow, SessionRow])],
  controllers: [UsersController],
  providers: [UsersService, PasswordService, AccountEvents, DemoUsersSeeder],
  exports: [UsersService, PasswordService, AccountEvents, DemoUsersSeeder],
})
export class UsersModule {}
