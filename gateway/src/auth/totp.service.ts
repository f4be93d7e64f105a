import { Injectable } from '@nestjs/common';
import { toDataURL } from 'qrcode';
import type { TotpBeginResponse } from '@stillwell/shared/access';
import { AccessError } from '../common/errors/access-error';
import { LogbookService } from '../logbook/logbook.service';
import { UserRow } from '../users/user.entity';
import { UsersService } from '../users/users.service';
import { actorOf, type Principal } from './principal';
import { acceptTotp, newTotpSecret, TOTP_SETTINGS, totpUri } from './totp';

/** A second factor: begin (a new key, shown once), confirm with a code from it, remove. */
@Injectable()
export class TotpService {
  constructor(
    private readonly users: UsersService,
    private readonly logbook: LogbookService,
  ) {}

  async begin(p: Principal): Promise<TotpBeginResponse> {
    const user = await this.users.findById(p.userId);
    if (!user) throw new AccessError('session-ended');
    if (user.totpSecret) throw new AccessError('totp-already-enabled');
    const secret = newTotpSecret();
    await this.users.transaction((tx) =>
      tx.update(UserRow, { id: p.userId }, { totpPendingSecret: secret }),
    );
    const uri = totpUri(secret, user.username);
    // the QR code is drawn here, so the key never goes to a third-party QR service
    return {
      secret,
      uri,
      qrDataUrl: await toDataURL(uri, { errorCorrectionLevel: 'M', margin: 2 }),
      ...TOTP_SETTINGS,
    };
  }

  async confirm(p: Principal, code: string): Promise<void> {
    await this.users.transaction(async (tx) => {
      const user = await tx.findOneBy(UserRow, { id: p.userId });
      if (!user) throw new AccessError('session-ended');
      if (user.totpSecret) throw new AccessError('totp-already-enabled');
      if (!user.totpPendingSecret) throw new AccessError('totp-not-started');
      const step = acceptTotp(user.totpPendingSecret, code, Date.now(), null);
      if (step === null) throw new AccessError('wrong-totp');
      await tx.update(
        UserRow,
        { id: p.userId },
        {
          totpSecret: user.totpPendingSecret,
          totpPendingSecret: null,
          totpLastStep: step,
          updatedAt: Date.now(),
        },
      );
      await this.logbook.append(
        { kind: 'user.totp-enrolled', actor: actorOf(p), payload: { userId: p.userId } },
        tx,
      );
    });
  }

  async remove(p: Principal): Promise<void> {
    await this.users.transaction(async (tx) => {
      const user = await tx.findOneBy(UserRow, { id: p.userId });
      if (!user?.totpSecret) throw new AccessError('totp-not-enabled');
      await tx.update(
        UserRow,
        { id: p.userId },
        { totpSecret: null, totpPendingSecret: null, totpLastStep: null, updatedAt: Date.now() },
      );
      await this.logbook.append(
        {
          kind: 'user.totp-removed',
          actor: actorOf(p),
          payload: { userId: p.userId, by: 'owner' },
        },
        tx,
      );
    });
  }
}
