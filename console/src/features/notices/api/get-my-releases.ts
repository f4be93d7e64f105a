import { queryOptions, useQuery } from '@tanstack/react-query';
import { myReleaseListSchema, type MyRelease } from '@stillwell/shared/notices';
import { apiGet } from '../../../lib/api-client';
import { noticesKeys } from './keys';

export function getMyReleases(signal?: AbortSignal): Promise<MyRelease[]> {
  return apiGet('/api/notices/mine', myReleaseListSchema, { signal });
}

export function getMyReleasesQueryOptions() {
  return queryOptions({
    queryKey: noticesKeys.mine(),
    queryFn: ({ signal }) => getMyReleases(signal),
    refetchInterval: 10_000,
  });
}

export function useMyReleases() {
  return useQuery(getMyReleasesQueryOptions());
}
