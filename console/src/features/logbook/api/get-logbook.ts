import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { logbookPageSchema, type LogbookPage } from '@stillwell/shared/logbook';
import { apiGet } from '../../../lib/api-client';
import { filterQuery, type LogbookView } from '../utils/filters';
import { logbookKeys } from './keys';

export function getLogbookPage(view: LogbookView, signal?: AbortSignal): Promise<LogbookPage> {
  return apiGet('/api/logbook', logbookPageSchema, {
    signal,
    query: {
      ...filterQuery(view.filter),
      page: String(view.page),
      pageSize: String(view.pageSize),
      sort: view.sort,
      order: view.order,
    },
  });
}

export function getLogbookPageQueryOptions(view: LogbookView) {
  return queryOptions({
    queryKey: logbookKeys.page(view),
    queryFn: ({ signal }) => getLogbookPage(view, signal),
    // new entries arrive over the live feed; no polling
    staleTime: Infinity,
    placeholderData: keepPreviousData,
  });
}

export function useLogbookPage(view: LogbookView) {
  return useQuery(getLogbookPageQueryOptions(view));
}
