import { Injectable, OnModuleDestroy } from '@nestjs/common';
import { Subject } from 'rxjs';

/**
 * Sessions that just ended or accounts that just changed, so that live sockets opened with them
 * are closed at once instead of when their token expires.
 */
export interface AccessEnded {
  userId: string;
  /** only these sessions; all of the user's when absent (disabled, roles changed) */
  sessionIds?: string[];
  reason: string;
}

@Injectable()
export class AccountEvents implements OnModuleDestroy {
  private readonly subject = new Subject<AccessEnded>();
  readonly ended$ = this.subject.asObservable();

  ended(event: AccessEnded): void {
    this.subject.next(event);
  }

  onModuleDestroy(): void {
    this.subject.complete();
  }
}
