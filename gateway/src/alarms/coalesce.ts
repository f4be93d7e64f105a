import {
  asyncScheduler,
  auditTime,
  groupBy,
  mergeMap,
  type Observable,
  type SchedulerLike,
} from 'rxjs';

/**
 * Per key, the first value opens a window of `ms`; the key comes out once at its end, however many
 * times it came in meanwhile. Keys do not hold each other up: a storm at one reservoir is one
 * push per window there, and another reservoir's push still goes out on time.
 */
export function coalescePerKey<K>(
  source: Observable<K>,
  ms: number,
  scheduler: SchedulerLike = asyncScheduler,
): Observable<K> {
  return source.pipe(
    groupBy((key) => key),
    mergeMap((same) => same.pipe(auditTime(ms, scheduler))),
  );
}
