import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MembersResponse } from '@shared/api/auth';
import { api } from '@client/lib/api-client';
import { memberKeys } from './keys';

export const getMembers = () => api<MembersResponse>('/api/members');

export const membersQueryOptions = () => queryOptions({ queryKey: memberKeys.lists(), queryFn: getMembers });

export const useMembers = () => useQuery(membersQueryOptions());
