/** Calls one route of the matrix (tests/api/route-cases.ts) with what its case's `setup` prepared. */
import type { PreparedRequest } from '../api/route-cases';
import { authHeader } from './auth';

export function callRoute(baseUrl: string, key: string, prepared: PreparedRequest, token: string | undefined): Promise<Response> {
  const [method, pattern] = key.split(' ');
  const url = pattern.replace(/:(\w+)/g, (_, name: string) => {
    const v = prepared.params?.[name];
    if (v === undefined) throw new Error(`${key}: setup gave no value for :${name}`);
    return encodeURIComponent(v);
  });
  return fetch(`${baseUrl}${url}`, {
    method,
    headers: {
      ...(token ? authHeader(token) : {}),
      ...(prepared.body !== undefined ? { 'content-type': 'application/json' } : {}),
      ...prepared.headers,
    },
    body: prepared.body !== undefined ? JSON.stringify(prepared.body) : undefined,
  });
}
