import { useMutation } from '@tanstack/react-query';
import { logbookEntrySchema, type LogbookEntry } from '@stillwell/shared/logbook';
import { apiDownload, apiPostForm } from '../../../lib/api-client';
import { filterQuery, type LogbookFilter } from '../utils/filters';

export interface ShiftLogInput {
  kind: 'note' | 'handover';
  text: string;
  to?: string;
  controls: string[];
  files: File[];
}

export function postShiftLog(input: ShiftLogInput): Promise<LogbookEntry> {
  const form = new FormData();
  form.set('text', input.text);
  if (input.kind === 'handover') form.set('to', input.to ?? '');
  if (input.controls.length) form.set('controls', input.controls.join(','));
  for (const f of input.files) form.append('attachments', f, f.name);
  const path = input.kind === 'note' ? '/api/logbook/shift-notes' : '/api/logbook/handovers';
  return apiPostForm(path, form, logbookEntrySchema);
}

/** The entry appears in the grid through the live feed, after its commit. */
export function usePostShiftLog() {
  return useMutation({ mutationFn: postShiftLog });
}

function save(blob: Blob, filename: string): void {
  const url = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = url;
  a.download = filename;
  a.click();
  URL.revokeObjectURL(url);
}

export async function exportCsv(filter: LogbookFilter): Promise<void> {
  const { blob, filename } = await apiDownload('/api/logbook/export', {
    query: filterQuery(filter),
  });
  save(blob, filename ?? 'stillwell-logbook.csv');
}

export async function downloadAttachment(seq: number, sha256: string, name: string): Promise<void> {
  const { blob } = await apiDownload(`/api/logbook/entries/${seq}/attachments/${sha256}`);
  save(blob, name);
}
