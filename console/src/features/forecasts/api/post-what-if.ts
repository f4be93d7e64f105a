import { useMutation } from '@tanstack/react-query';
import {
  compareResponseSchema,
  whatIfResponseSchema,
  type CompareRequest,
  type CompareResponse,
  type WhatIfRequest,
  type WhatIfResponse,
} from '@stillwell/shared/forecasts';
import { apiPost } from '../../../lib/api-client';

const base = (reservoirId: string) =>
  `/api/reservoirs/${encodeURIComponent(reservoirId)}/forecasts`;

export function postWhatIf(reservoirId: string, body: WhatIfRequest): Promise<WhatIfResponse> {
  return apiPost(`${base(reservoirId)}/what-if`, body, whatIfResponseSchema);
}

export function postCompare(reservoirId: string, body: CompareRequest): Promise<CompareResponse> {
  return apiPost(`${base(reservoirId)}/compare`, body, compareResponseSchema);
}

/** A what-if is a question, not a change: nothing in the cache depends on it. */
export function useWhatIf(reservoirId: string) {
  return useMutation({ mutationFn: (body: WhatIfRequest) => postWhatIf(reservoirId, body) });
}

export function useCompareSchedules(reservoirId: string) {
  return useMutation({ mutationFn: (body: CompareRequest) => postCompare(reservoirId, body) });
}
