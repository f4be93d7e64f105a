import type { LogbookEntry } from '@stillwell/shared/logbook';

/** The logbook screen's filters; empty strings mean "any". Times are ISO (UTC). */
export interface LogbookFilter {
  from: string;
  to: string;
  kind: string;
  actor: string;
  gate: string;
}

export const NO_FILTER: LogbookFilter = { from: '', to: '', kind: '', actor: '', gate: '' };

export type SortField = 'seq' | 'time' | 'kind' | 'actorName';

export interface LogbookView {
  filter: LogbookFilter;
  page: number;
  pageSize: number;
  sort: SortField;
  order: 'asc' | 'desc';
}

export const DEFAULT_VIEW: LogbookView = {
  filter: NO_FILTER,
  page: 0,
  pageSize: 50,
  sort: 'seq',
  order: 'desc',
};

/** The filter as the gateway's query (only what is set). */
export function filterQuery(f: LogbookFilter): Record<string, string> {
  return Object.fromEntries(Object.entries(f).filter(([, v]) => v.trim() !== '')) as Record<
    string,
    string
  >;
}

/** Whether a pushed entry belongs in the filtered list (the same rules as the gateway's query). */
export function matchesFilter(e: LogbookEntry, f: LogbookFilter): boolean {
  if (f.kind) {
    if (f.kind.endsWith('.') ? !e.kind.startsWith(f.kind) : e.kind !== f.kind) return false;
  }
  if (f.actor && e.actorName !== f.actor) return false;
  if (f.gate) {
    const controls = Array.isArray(e.payload.controls) ? (e.payload.controls as unknown[]) : [];
    if (!controls.includes(f.gate)) return false;
  }
  if (f.from && e.time < new Date(f.from).toISOString()) return false;
  if (f.to && e.time > new Date(f.to).toISOString()) return false;
  return true;
}

/** One line about an entry for the grid: what happened, in the payload's own words. */
export function summaryOf(e: LogbookEntry): string {
  const p = e.payload as Record<string, unknown>;
  const parts: string[] = [];
  if (typeof p.orderId === 'number') parts.push(`order ${p.orderId}`);
  if (typeof p.commandId === 'string') parts.push(p.commandId);
  if (e.kind === 'shift.handover')
    parts.push(`${String(p.from)} to ${String(p.to)}: ${String(p.text)}`);
  else if (typeof p.text === 'string') parts.push(p.text);
  for (const key of ['comment', 'reason', 'detail'] as const)
    if (typeof p[key] === 'string') parts.push(String(p[key]));
  if (Array.isArray(p.attachments) && p.attachments.length)
    parts.push(`${p.attachments.length} attachment(s)`);
  return parts.join(' · ');
}
