import { Body, Controller, Get, HttpCode, Param, Post, Put } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import {
  contactInputSchema,
  importRequestSchema,
  zoneInputSchema,
  type Contact,
  type ContactInput,
  type ImportRequest,
  type ImportResult,
  type Zone,
  type ZoneInput,
} from '@stillwell/shared/notices';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RegistryService } from './registry.service';
import { ZodBody } from './zod-body.pipe';

/**
 * The downstream registry: zones with their travel-time tables (entered by the duty engineer, kept
 * with the liaison: notices.manage) and contacts (the liaison's: contacts.manage).
 */
@ApiTags('downstream')
@Controller('reservoirs/:reservoirId')
export class RegistryController {
  constructor(private readonly registry: RegistryService) {}

  @Get('zones')
  @Permission('notices.read')
  @ApiOkResponse({ description: 'Zones below the dam, nearest first (Zone[])' })
  zones(@Param('reservoirId') reservoirId: string): Promise<Zone[]> {
    return this.registry.zones(reservoirId);
  }

  @Post('zones')
  @Permission('notices.manage')
  @ApiOkResponse({ description: 'The new zone (body: ZoneInput)' })
  addZone(
    @Param('reservoirId') reservoirId: string,
    @Body(new ZodBody(zoneInputSchema)) body: ZoneInput,
    @CurrentPrincipal() p: Principal,
  ): Promise<Zone> {
    return this.registry.saveZone(reservoirId, null, body, actorOf(p));
  }

  @Put('zones/:zoneId')
  @Permission('notices.manage')
  @ApiOkResponse({ description: 'The zone as changed (body: ZoneInput)' })
  editZone(
    @Param('reservoirId') reservoirId: string,
    @Param('zoneId') zoneId: string,
    @Body(new ZodBody(zoneInputSchema)) body: ZoneInput,
    @CurrentPrincipal() p: Principal,
  ): Promise<Zone> {
    return this.registry.saveZone(reservoirId, zoneId, body, actorOf(p));
  }

  @Get('contacts')
  @Permission('contacts.manage')
  @ApiOkResponse({
    description: 'Every contact below the dam, by zone and place in the chain (Contact[])',
  })
  contacts(@Param('reservoirId') reservoirId: string): Promise<Contact[]> {
    return this.registry.contacts(reservoirId);
  }

  @Post('contacts')
  @Permission('contacts.manage')
  @ApiOkResponse({ description: 'The new contact (body: ContactInput)' })
  addContact(
    @Param('reservoirId') reservoirId: string,
    @Body(new ZodBody(contactInputSchema)) body: ContactInput,
    @CurrentPrincipal() p: Principal,
  ): Promise<Contact> {
    return this.registry.saveContact(reservoirId, null, body, actorOf(p));
  }

  @Put('contacts/:contactId')
  @Permission('contacts.manage')
  @ApiOkResponse({
    description:
      'The contact as changed; set active false to stop telling them (body: ContactInput)',
  })
  editContact(
    @Param('reservoirId') reservoirId: string,
    @Param('contactId') contactId: string,
    @Body(new ZodBody(contactInputSchema)) body: ContactInput,
    @CurrentPrincipal() p: Principal,
  ): Promise<Contact> {
    return this.registry.saveContact(reservoirId, contactId, body, actorOf(p));
  }

  @Post('contacts/import')
  @HttpCode(200)
  @Permission('contacts.manage')
  @ApiOkResponse({
    description:
      'A contacts CSV ({csv}); all rows or none: with any problem nothing is imported and every problem is listed by row and column (ImportResult)',
  })
  importContacts(
    @Param('reservoirId') reservoirId: string,
    @Body(new ZodBody(importRequestSchema)) body: ImportRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<ImportResult> {
    return this.registry.importCsv(reservoirId, body.csv, actorOf(p));
  }
}
