import type { NoticeLead } from '@stillwell/shared/reports';

export interface NoticeRecipientFacts {
  noticeId: string;
  orderId: string;
  zoneName: string;
  contactName: string;
  sentAt: number | null;
  leadTimeS: number;
  acknowledgedAt: number | null;
  /** the notice's planned release start */
  plannedStartAt: number;
  /** when the order was executed (the release began), if it was */
  executedAt: number | null;
}

/**
 * The lead time each contact got: from the moment their message went to the mail server to the
 * start of the release it warned of (the order's execution; the planned start when not executed).
 */
export function noticeLeads(recipients: readonly NoticeRecipientFacts[]): NoticeLead[] {
  return recipients.map((r) => {
    const releaseAt = r.executedAt ?? r.plannedStartAt;
    const gotS = r.sentAt === null ? null : (releaseAt - r.sentAt) / 1000;
    return {
      noticeId: r.noticeId,
      orderId: r.orderId,
      zoneName: r.zoneName,
      contactName: r.contactName,
      sentAt: r.sentAt,
      releaseAt,
      neededS: r.leadTimeS,
      gotS,
      short: gotS === null || gotS < r.leadTimeS,
      acknowledgedAt: r.acknowledgedAt,
    };
  });
}
