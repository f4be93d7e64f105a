import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  logbookHeadSchema,
  verificationReportSchema,
  type VerificationReport,
} from '@stillwell/shared/logbook';
import { apiGet } from '../../../lib/api-client';
import { logbookKeys } from './keys';

export function getHeadQueryOptions() {
  return queryOptions({
    queryKey: logbookKeys.head(),
    queryFn: ({ signal }) => apiGet('/api/logbook/head', logbookHeadSchema, { signal }),
    staleTime: Infinity,
  });
}

export function useHead() {
  return useQuery(getHeadQueryOptions());
}

/** The last verification the gateway made (scheduled, or asked for): null before the first. */
export function useLastVerification() {
  return useQuery({
    queryKey: logbookKeys.verification(),
    queryFn: ({ signal }) =>
      apiGet('/api/logbook/verification', verificationReportSchema.nullable(), { signal }),
    staleTime: 60_000,
  });
}

/** Recompute the chain and rehash every attachment now. */
export function useVerifyNow() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => apiGet('/api/logbook/verify', verificationReportSchema),
    onSuccess: (report: VerificationReport) =>
      queryClient.setQueryData(logbookKeys.verification(), report),
  });
}
