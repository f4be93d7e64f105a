import { Body, Controller, HttpCode, Post } from '@nestjs/common';
import { ApiNoContentResponse, ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { TotpBeginResponse } from '@stillwell/shared/access';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { RequiresStepUp } from '../common/decorators/requires-step-up.decorator';
import { TotpCodeDto } from './dto/auth.dto';
import type { Principal } from './principal';
import { TotpService } from './totp.service';

/** One's own second factor (TOTP, RFC 6238). Adding or removing it needs a recent step-up. */
@ApiTags('auth')
@Controller('auth/totp')
export class TotpController {
  constructor(private readonly totp: TotpService) {}

  @Post('begin')
  @HttpCode(200)
  @Permission('sessions.own')
  @RequiresStepUp()
  @ApiOkResponse({
    description: 'TotpBeginResponse: a new key, its otpauth URI and QR code (shown once)',
  })
  begin(@CurrentPrincipal() p: Principal): Promise<TotpBeginResponse> {
    return this.totp.begin(p);
  }

  @Post('confirm')
  @HttpCode(204)
  @Permission('sessions.own')
  @ApiNoContentResponse({ description: 'A code from the new key turns the second factor on' })
  confirm(@CurrentPrincipal() p: Principal, @Body() body: TotpCodeDto): Promise<void> {
    return this.totp.confirm(p, body.code);
  }

  @Post('remove')
  @HttpCode(204)
  @Permission('sessions.own')
  @RequiresStepUp()
  @ApiNoContentResponse({ description: 'Turns the second factor off' })
  remove(@CurrentPrincipal() p: Principal): Promise<void> {
    return this.totp.remove(p);
  }
}
