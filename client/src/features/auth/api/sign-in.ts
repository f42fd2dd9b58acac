import { useMutation } from '@tanstack/react-query';
import type { SessionResponse, SignInRequest } from '@shared/api/auth';
import { api, jsonBody } from '@client/lib/api-client';
import { acceptSession } from '@client/lib/session';

export const signIn = (body: SignInRequest) =>
  api<SessionResponse>('/api/auth/sign-in', { method: 'POST', ...jsonBody(body) });

export const useSignIn = () =>
  useMutation({ mutationFn: signIn, onSuccess: (session) => acceptSession(session), networkMode: 'always' });
