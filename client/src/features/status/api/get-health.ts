import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Health } from '@shared/api/health';
import { api } from '@client/lib/api-client';

export const statusKeys = {
  all: ['status'] as const,
  health: () => [...statusKeys.all, 'health'] as const,
};

export const getHealth = () => api<Health>('/api/health');

export const healthQueryOptions = () =>
  queryOptions({ queryKey: statusKeys.health(), queryFn: getHealth, refetchInterval: 60_000, retry: false });

export const useHealth = () => useQuery(healthQueryOptions());
