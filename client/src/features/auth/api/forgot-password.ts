import { useMutation } from '@tanstack/react-query';
import type { ForgotPasswordRequest, MessageResponse } from '@shared/api/auth';
import { api, jsonBody } from '@client/lib/api-client';

export const forgotPassword = (body: ForgotPasswordRequest) =>
  api<MessageResponse>('/api/auth/forgot-password', { method: 'POST', ...jsonBody(body) });

export const useForgotPassword = () => useMutation({ mutationFn: forgotPassword, networkMode: 'always' });
