import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DevMail, DevMailList } from '@shared/api/dev-mail';
import { api } from '@client/lib/api-client';

export const devMailKeys = {
  all: ['dev-mail'] as const,
  list: () => [...devMailKeys.all, 'list'] as const,
  detail: (id: string) => [...devMailKeys.all, 'detail', id] as const,
};

export const getMailList = () => api<DevMailList>('/api/dev/mail');
export const getMail = (id: string) => api<DevMail>(`/api/dev/mail/${encodeURIComponent(id)}`);

export const mailListQueryOptions = () => queryOptions({ queryKey: devMailKeys.list(), queryFn: getMailList, staleTime: 0, retry: false });
export const mailQueryOptions = (id: string) => queryOptions({ queryKey: devMailKeys.detail(id), queryFn: () => getMail(id), enabled: !!id });

export const useMailList = () => useQuery(mailListQueryOptions());
export const useMail = (id: string) => useQuery(mailQueryOptions(id));
