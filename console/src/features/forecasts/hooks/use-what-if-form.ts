import { useMemo, useState } from 'react';
import type { CompareResponse } from '@stillwell/shared/forecasts';
import type { ReservoirDefinition } from '@stillwell/shared/reservoirs';
import { ApiError, describeError } from '../../../lib/api-client';
import { useCompareSchedules } from '../api/post-what-if';
import {
  buildCompareRequest,
  problemsFromApi,
  type FormProblem,
  type RequestContext,
  type WhatIfValues,
} from '../utils/what-if-request';
import {
  asScheduleControls,
  defaultSchedules,
  sampleHydrograph,
  scheduleControls,
} from '../utils/what-if-tables';

export function initialValues(definition: ReservoirDefinition): WhatIfValues {
  const { a, b } = defaultSchedules(scheduleControls(definition));
  return {
    hydrograph: sampleHydrograph(),
    a,
    b,
    startElevation: '',
    durationH: '',
    startGates: 'current',
  };
}

export interface WhatIfForm {
  values: WhatIfValues;
  update: (patch: Partial<WhatIfValues>) => void;
  /** the problems shown: the form's own once a run was asked for, else the gateway's last 400 */
  problems: FormProblem[];
  run: () => void;
  running: boolean;
  result: CompareResponse | undefined;
  /** the values changed since the result shown was asked for */
  outdated: boolean;
  /** a failure that is not about a field (the gateway unreachable, refused, ...) */
  failure: string | null;
}

/**
 * The what-if page's state: the form's values, their problems and the comparison run. After the
 * first run is asked for, the form is checked again on every change, so a fixed row clears at
 * once; the gateway's 400 problems stand until the values change.
 */
export function useWhatIfForm(definition: ReservoirDefinition): WhatIfForm {
  const context = useMemo<RequestContext>(() => {
    const elevations = definition.storageTable.map((r) => r.elevation);
    return {
      controls: asScheduleControls(scheduleControls(definition)),
      storageRange: [Math.min(...elevations), Math.max(...elevations)],
    };
  }, [definition]);
  const [values, setValues] = useState<WhatIfValues>(() => initialValues(definition));
  const [asked, setAsked] = useState(false);
  const [posted, setPosted] = useState<WhatIfValues | null>(null);
  const compare = useCompareSchedules(definition.id);

  const checked = useMemo(() => buildCompareRequest(values, context), [values, context]);
  const refused =
    compare.error instanceof ApiError && compare.error.status === 400 ? compare.error : null;
  const apiProblems =
    refused && posted === values ? problemsFromApi(refused.details) : ([] as FormProblem[]);
  const problems = asked && checked.problems.length > 0 ? checked.problems : apiProblems;

  const run = () => {
    setAsked(true);
    if (!checked.request) return;
    setPosted(values);
    compare.mutate(checked.request);
  };

  return {
    values,
    update: (patch) => setValues((v) => ({ ...v, ...patch })),
    problems,
    run,
    running: compare.isPending,
    result: compare.data,
    outdated: compare.data !== undefined && posted !== values,
    failure: compare.error && !refused ? describeError(compare.error) : null,
  };
}
