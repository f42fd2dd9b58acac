import { useMutation } from '@tanstack/react-query';
import type { ResetPasswordRequest } from '@shared/api/auth';
import { api, jsonBody } from '@client/lib/api-client';

export const resetPassword = (body: ResetPasswordRequest) =>
  api<void>('/api/auth/reset-password', { method: 'POST', ...jsonBody(body) });

export const useResetPassword = () => useMutation({ mutationFn: resetPassword, networkMode: 'always' });
