import { queryOptions, useQuery } from '@tanstack/react-query';
import type { z } from 'zod';
import type { QueueResponseSchema } from '@shared/api/review';
import { api } from '@client/lib/api-client';
import { reviewKeys } from './keys';

export type QueueResponse = z.infer<typeof QueueResponseSchema>;

export const getQueue = () => api<QueueResponse>('/api/review/queue');

export const queueQueryOptions = () => queryOptions({ queryKey: reviewKeys.queue(), queryFn: getQueue, refetchInterval: 60_000 });

export const useQueue = () => useQuery(queueQueryOptions());
