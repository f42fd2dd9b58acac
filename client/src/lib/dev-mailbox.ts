/**
 * Whether this server has the development mailbox (`/dev/mail`: never in production), so the header
 * and the brief panel can point the admin or the engineer who sent a brief at the message. Asked once
 * per session; any answer but 200 means "no mailbox here".
 */
import { useQuery } from '@tanstack/react-query';
import { apiFetch } from './api-client';

export function useDevMailbox(enabled: boolean): boolean {
  const q = useQuery({
    queryKey: ['dev-mail', 'available'],
    queryFn: async () => {
      try {
        return (await apiFetch('/api/dev/mail')).ok;
      } catch {
        return false;
      }
    },
    enabled,
    staleTime: Infinity,
    retry: false,
  });
  return enabled && q.data === true;
}
