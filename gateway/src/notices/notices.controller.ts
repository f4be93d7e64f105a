import {
  BadRequestException,
  Body,
  Controller,
  Get,
  HttpCode,
  Param,
  Post,
  Put,
  Query,
} from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import {
  noticeEditSchema,
  prepareRequestSchema,
  type ClearanceVerdict,
  type Notice,
  type NoticeEdit,
  type PrepareRequest,
} from '@stillwell/shared/notices';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { ClearanceService } from './clearance.service';
import { NoticeBoardService } from './notice-board.service';
import { NoticesService } from './notices.service';
import { ZodBody } from './zod-body.pipe';

/**
 * Stakeholders hold notices.read for their own releases. The board names every contact with their
 * address and phone, so a stakeholder-only account sees the notices of its own zones and, among the
 * recipients, itself only.
 */
const stakeholderOnly = (p: Principal) => p.roles.every((r) => r === 'stakeholder');

@ApiTags('downstream')
@Controller()
export class NoticesController {
  constructor(
    private readonly notices: NoticesService,
    private readonly board: NoticeBoardService,
    private readonly clearance: ClearanceService,
  ) {}

  @Get('reservoirs/:reservoirId/notices')
  @Permission('notices.read')
  @ApiOkResponse({
    description:
      'Notices, newest first, each with who has been told, acknowledged, is silent (Notice[])',
  })
  list(
    @Param('reservoirId') reservoirId: string,
    @Query('orderId') orderId: string | undefined,
    @CurrentPrincipal() p: Principal,
  ): Promise<Notice[]> {
    if (stakeholderOnly(p))
      return this.board.listForStakeholder(reservoirId, p.userId, { orderId });
    return this.board.list(reservoirId, { orderId });
  }

  @Post('reservoirs/:reservoirId/notices/prepare')
  @HttpCode(200)
  @Permission('notices.manage')
  @ApiOkResponse({
    description:
      'Prepares the notices of a planned release (what drafting an order does by itself): one per zone whose threshold it reaches (PrepareRequest -> Notice[])',
  })
  prepare(
    @Param('reservoirId') reservoirId: string,
    @Body(new ZodBody(prepareRequestSchema)) body: PrepareRequest,
    @CurrentPrincipal() p: Principal,
  ): Promise<Notice[]> {
    return this.notices.prepareForOrder({ ...body, reservoirId, emergency: false }, actorOf(p));
  }

  @Get('reservoirs/:reservoirId/orders/:orderId/clearance')
  @Permission('notices.read')
  @ApiOkResponse({
    description: 'Whether downstream is clear for an order, and who is short (ClearanceVerdict)',
  })
  async clearanceOf(
    @Param('reservoirId') reservoirId: string,
    @Param('orderId') orderId: string,
    @Query('targetReleaseM3s') target: string,
    @Query('currentReleaseM3s') current: string | undefined,
    @CurrentPrincipal() p: Principal,
  ): Promise<ClearanceVerdict> {
    const targetReleaseM3s = Number(target);
    if (!Number.isFinite(targetReleaseM3s) || targetReleaseM3s <= 0) {
      throw new BadRequestException(['targetReleaseM3s: a release in m3/s, more than 0']);
    }
    const verdict = await this.clearance.check({
      orderId,
      reservoirId,
      targetReleaseM3s,
      currentReleaseM3s: current === undefined ? null : Number(current),
      plannedStartAt: null,
      durationS: null,
      emergency: false,
    });
    if (!stakeholderOnly(p)) return verdict;
    // who else downstream is short is not a stakeholder's to see; the zones are
    const zones = [...new Set(verdict.shortfalls.map((s) => s.zoneName))];
    return {
      ...verdict,
      summary: zones.length
        ? `Not clear downstream: ${zones.join(', ')} not yet told or within the lead time.`
        : verdict.summary,
      shortfalls: verdict.shortfalls.map((s) => ({ ...s, contactId: null, contactName: null })),
    };
  }

  @Put('notices/:noticeId/wording')
  @Permission('notices.manage')
  @ApiOkResponse({
    description: 'The wording (subject and template) of a prepared notice (NoticeEdit -> Notice)',
  })
  edit(
    @Param('noticeId') noticeId: string,
    @Body(new ZodBody(noticeEditSchema)) body: NoticeEdit,
    @CurrentPrincipal() p: Principal,
  ): Promise<Notice> {
    return this.notices.edit(noticeId, body, actorOf(p));
  }

  @Post('notices/:noticeId/send')
  @HttpCode(200)
  @Permission('notices.send')
  @ApiOkResponse({
    description: 'Sends a prepared notice to its first call; each delivery recorded (Notice)',
  })
  send(@Param('noticeId') noticeId: string, @CurrentPrincipal() p: Principal): Promise<Notice> {
    return this.notices.send(noticeId, actorOf(p));
  }
}
