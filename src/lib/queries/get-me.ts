import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MeResponse } from '../../../shared/api/responses';
import { apiRequest } from '../api-client';
import { isUnauthenticated } from '../api-error';

/** The signed-in user and their studios; null when nobody is signed in. */
export async function getMe(): Promise<MeResponse | null> {
  try {
    return await apiRequest<MeResponse>('/me');
  } catch (error) {
    if (isUnauthenticated(error)) return null;
    throw error;
  }
}

export const getMeQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe });

export function useMe() {
  return useQuery(getMeQueryOptions());
}
