import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { userSchema } from '@stillwell/shared/access';
import { apiGet } from '../../../lib/api-client';
import { usersKeys } from './keys';

export function getUsers(signal?: AbortSignal) {
  return apiGet('/api/users', z.array(userSchema), { signal });
}

export function getUsersQueryOptions() {
  return queryOptions({ queryKey: usersKeys.all(), queryFn: ({ signal }) => getUsers(signal) });
}

/** Every account (administrators only). */
export function useUsers() {
  return useQuery(getUsersQueryOptions());
}
