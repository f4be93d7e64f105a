import type { LogbookView } from '../utils/filters';

export const logbookKeys = {
  all: () => ['logbook'] as const,
  pages: () => ['logbook', 'page'] as const,
  page: (view: LogbookView) => ['logbook', 'page', view] as const,
  entry: (seq: number) => ['logbook', 'entry', seq] as const,
  head: () => ['logbook', 'head'] as const,
  verification: () => ['logbook', 'verification'] as const,
};
