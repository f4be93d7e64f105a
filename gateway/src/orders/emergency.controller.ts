import { Body, Controller, Get, HttpCode, Param, Post, Put } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import {
  declareEmergencyRequestSchema,
  endEmergencyRequestSchema,
  updateRuleRequestSchema,
  type AutomaticRule,
  type AutomationView,
  type CurrentEmergency,
  type DeclareEmergencyRequest,
  type Emergency,
  type UpdateRuleRequest,
} from '@stillwell/shared/orders';
import type { Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RequiresStepUp } from '../common/decorators/requires-step-up.decorator';
import { ZodApiBody } from './api-doc';
import { AutomationService } from './automation.service';
import { EmergencyService } from './emergency.service';
import { ZodBodyPipe } from './zod-body.pipe';

/** Declared emergencies and automatic rules of a reservoir. */
@ApiTags('orders')
@Controller('reservoirs/:id')
export class EmergencyController {
  constructor(
    private readonly emergencies: EmergencyService,
    private readonly automation: AutomationService,
  ) {}

  @Get('emergency')
  @Permission('orders.read')
  @ApiOkResponse({ description: '{ emergency }: the one in force, or null' })
  async current(@Param('id') id: string): Promise<CurrentEmergency> {
    return { emergency: await this.emergencies.current(id) };
  }

  @Post('emergency')
  @HttpCode(200)
  @Permission('emergency.declare')
  @RequiresStepUp()
  @ZodApiBody(declareEmergencyRequestSchema, 'a duty engineer only')
  @ApiOkResponse({ description: 'Declared: operators may execute without prior authorisation' })
  declare(
    @Param('id') id: string,
    @Body(new ZodBodyPipe(declareEmergencyRequestSchema)) body: DeclareEmergencyRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Emergency> {
    return this.emergencies.declare(id, body, p);
  }

  @Post('emergency/end')
  @HttpCode(200)
  @Permission('emergency.declare')
  @RequiresStepUp()
  @ZodApiBody(endEmergencyRequestSchema, 'a duty engineer only')
  @ApiOkResponse({ description: 'Ended (its orders still await countersignature)' })
  end(
    @Param('id') id: string,
    @Body(new ZodBodyPipe(endEmergencyRequestSchema)) body: { reason: string },
    @CurrentPrincipal() p: Principal,
  ): Promise<Emergency> {
    return this.emergencies.end(id, body.reason, p);
  }

  @Get('automation')
  @Permission('orders.read')
  @ApiOkResponse({ description: 'Every gate and valve with its automatic rule, and recent events' })
  view(@Param('id') id: string): Promise<AutomationView> {
    return this.automation.view(id);
  }

  @Put('automation/:control')
  @Permission('automation.edit')
  @RequiresStepUp()
  @ZodApiBody(updateRuleRequestSchema)
  @ApiOkResponse({
    description: 'Set and sent to the controller (device state pending until it answers)',
  })
  update(
    @Param('id') id: string,
    @Param('control') control: string,
    @Body(new ZodBodyPipe(updateRuleRequestSchema, 'rule-invalid')) body: UpdateRuleRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<AutomaticRule> {
    return this.automation.update(id, control, body, p);
  }
}
