import { Controller, Get, HttpCode, Post } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import type { BackupFile } from './backup-files';
import { BackupService, type TakenBackup } from './backup.service';

/**
 * Backups contain every account and the whole record, so only administrators take or list them
 * (backups.manage).
 */
@ApiTags('backups')
@Controller('backups')
export class BackupController {
  constructor(private readonly backups: BackupService) {}

  @Get()
  @Permission('backups.manage')
  @ApiOkResponse({ description: 'The backups kept, newest first' })
  list(): BackupFile[] {
    return this.backups.list();
  }

  @Post()
  @HttpCode(201)
  @Permission('backups.manage')
  @ApiOkResponse({ description: 'A backup taken now, while the gateway runs; in the logbook' })
  take(@CurrentPrincipal() p: Principal): Promise<TakenBackup> {
    return this.backups.take(actorOf(p));
  }
}
