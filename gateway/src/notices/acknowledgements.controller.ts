import {
  Controller,
  Get,
  Header,
  HttpCode,
  NotFoundException,
  Param,
  Post,
  Res,
} from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import type { MyRelease } from '@stillwell/shared/notices';
import { actorOf, type Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { Public } from '../common/decorators/public.decorator';
import { AckLinks } from './ack-links';
import { acknowledgedPage, refusedPage } from './ack-page';
import { AcknowledgementsService } from './acknowledgements.service';

@ApiTags('downstream')
@Controller('notices')
export class AcknowledgementsController {
  constructor(
    private readonly links: AckLinks,
    private readonly acks: AcknowledgementsService,
  ) {}

  /**
   * The personal link in a notice. Public: the person may have no account. Opening it records the
   * acknowledgement once; again, it says when. A forged or expired link records nothing.
   */
  @Get('ack/:token')
  @Public()
  @Header('Content-Type', 'text/html; charset=utf-8')
  @Header('Cache-Control', 'no-store')
  @Header('Referrer-Policy', 'no-referrer')
  @ApiOkResponse({
    description: 'A plain page: acknowledged (200), or refused (400 forged, 410 expired)',
  })
  async viaLink(
    @Param('token') token: string,
    @Res({ passthrough: true }) res: Response,
  ): Promise<string> {
    const check = this.links.check(token);
    if (!check.ok) {
      res.status(check.reason === 'expired' ? 410 : 400);
      return refusedPage(check.reason);
    }
    try {
      return acknowledgedPage(await this.acks.acknowledge(check.recipientId, 'link', null));
    } catch (error) {
      if (!(error instanceof NotFoundException)) throw error;
      res.status(404);
      return refusedPage('unknown');
    }
  }

  @Get('mine')
  @Permission('notices.acknowledge')
  @ApiOkResponse({
    description: "Upcoming and active releases for the signed-in stakeholder's zones (MyRelease[])",
  })
  mine(@CurrentPrincipal() p: Principal): Promise<MyRelease[]> {
    return this.acks.mine(p.userId);
  }

  @Post('mine/:recipientId/acknowledge')
  @HttpCode(200)
  @Permission('notices.acknowledge')
  @ApiOkResponse({
    description: 'Acknowledges a notice sent to the signed-in stakeholder (again: harmless)',
  })
  async acknowledge(
    @Param('recipientId') recipientId: string,
    @CurrentPrincipal() p: Principal,
  ): Promise<{ recorded: boolean; acknowledgedAt: number }> {
    const outcome = await this.acks.acknowledge(recipientId, 'console', actorOf(p), p.userId);
    return { recorded: outcome.recorded, acknowledgedAt: outcome.acknowledgedAt };
  }
}
