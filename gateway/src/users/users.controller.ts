import {
  BadRequestException,
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  Patch,
  Post,
} from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { CreateUserResponse, ResetPasswordResponse, User } from '@stillwell/shared/access';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RequiresStepUp } from '../common/decorators/requires-step-up.decorator';
import { CreateUserDto, ResetPasswordDto, UpdateUserDto } from './dto/user.dto';
import { toUserView } from './user-view';
import { UsersService } from './users.service';

/** Accounts, for administrators. Every change needs a recent step-up. */
@ApiTags('users')
@Controller('users')
export class UsersController {
  constructor(private readonly users: UsersService) {}

  @Get()
  @Permission('users.manage')
  @ApiOkResponse({ description: 'Every account (User[])' })
  async list(): Promise<User[]> {
    return (await this.users.list()).map(toUserView);
  }

  @Post()
  @Permission('users.manage')
  @RequiresStepUp()
  @ApiOkResponse({
    description: 'The new account and its one-time temporary password (CreateUserResponse)',
  })
  async create(
    @Body() body: CreateUserDto,
    @CurrentPrincipal() p: Principal,
  ): Promise<CreateUserResponse> {
    const { user, temporaryPassword } = await this.users.create(body, actorOf(p), 'administrator');
    return { user: toUserView(user), temporaryPassword: temporaryPassword! };
  }

  @Patch(':id')
  @Permission('users.manage')
  @RequiresStepUp()
  @ApiOkResponse({
    description: 'Roles, display name, disabled (disabling ends every session at once)',
  })
  async update(
    @Param('id') id: string,
    @Body() body: UpdateUserDto,
    @CurrentPrincipal() p: Principal,
  ): Promise<User> {
    if (body.displayName === undefined && body.roles === undefined && body.disabled === undefined) {
      throw new BadRequestException('nothing to change');
    }
    return toUserView(await this.users.update(id, body, actorOf(p)));
  }

  @Post(':id/reset-password')
  @HttpCode(200)
  @Permission('users.manage')
  @RequiresStepUp()
  @ApiOkResponse({
    description: 'A one-time temporary password; the user must change it; sessions ended',
  })
  async resetPassword(
    @Param('id') id: string,
    @Body() body: ResetPasswordDto,
    @CurrentPrincipal() p: Principal,
  ): Promise<ResetPasswordResponse> {
    return { temporaryPassword: await this.users.resetPassword(id, body, actorOf(p)) };
  }

  @Delete(':id/sessions')
  @HttpCode(204)
  @Permission('users.manage')
  @ApiOkResponse({ description: 'Signs the user out everywhere (the account stays enabled)' })
  async endSessions(@Param('id') id: string, @CurrentPrincipal() p: Principal): Promise<void> {
    await this.users.endSessions(id, actorOf(p));
  }
}
