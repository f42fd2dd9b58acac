/**
 * The photo upload queue. Photos are kept on the device (Dexie `photos`, blob and all) the moment
 * they are taken; this queue sends each one to the server once its survey has synced, one at a time,
 * with progress from XMLHttpRequest. A dropped connection just ends the round: the next round (on
 * reconnect, every few seconds, or when a photo is added) sends it again, and the server answers a
 * repeat of the same photo id with the stored photo, so nothing is stored twice.
 */
import { useSyncExternalStore } from 'react';
import { db, type LocalPhoto } from '@client/offline/db';
import { currentAccessToken, refreshAccessToken } from '@client/lib/api-client';

export interface UploadStatus {
  /** 0..1 while sending. */
  progress?: number;
  /** A refusal the user must act on (too large, not an image). */
  error?: string;
  /** A failure that will be retried. */
  retrying?: string;
}

let statuses: Record<string, UploadStatus> = {};
const listeners = new Set<() => void>();
function setStatus(id: string, s: UploadStatus | null) {
  const next = { ...statuses };
  if (s) next[id] = s;
  else delete next[id];
  statuses = next;
  listeners.forEach((l) => l());
}

export function usePhotoUploadStatus(): Record<string, UploadStatus> {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => statuses,
  );
}

interface XhrResult {
  status: number;
  message: string;
}

function send(photo: LocalPhoto, token: string | null): Promise<XhrResult> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('PUT', `/api/photos/${encodeURIComponent(photo.id)}`);
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) setStatus(photo.id, { progress: e.loaded / e.total });
    };
    xhr.onload = () => {
      let message = '';
      try {
        message = (JSON.parse(xhr.responseText) as { error?: { message?: string } }).error?.message ?? '';
      } catch {
        /* not JSON */
      }
      resolve({ status: xhr.status, message });
    };
    xhr.onerror = () => reject(new Error('network'));
    xhr.onabort = () => reject(new Error('aborted'));
    xhr.ontimeout = () => reject(new Error('timeout'));
    const form = new FormData();
    form.set('surveyId', photo.surveyId);
    form.set('entityKind', photo.entity.kind);
    form.set('entityId', photo.entity.id);
    form.set('caption', photo.caption);
    form.set('file', photo.blob, `${photo.id}`);
    setStatus(photo.id, { progress: 0 });
    xhr.send(form);
  });
}

let running: Promise<void> | null = null;
let again = false;

async function round(): Promise<void> {
  const waiting = await db.photos.where('uploaded').equals(0).toArray();
  for (const photo of waiting) {
    if (statuses[photo.id]?.error) continue;
    const survey = await db.surveys.get(photo.surveyId);
    if (!survey || survey.serverRevision === 0) continue; // the survey reaches the server first
    let res: XhrResult;
    try {
      res = await send(photo, currentAccessToken());
      if (res.status === 401) {
        const fresh = await refreshAccessToken();
        if (!fresh) {
          setStatus(photo.id, { retrying: 'Sign in again to upload.' });
          return;
        }
        res = await send(photo, fresh);
      }
    } catch {
      setStatus(photo.id, { retrying: 'Connection lost; will try again.' });
      return; // offline: stop this round
    }
    if (res.status === 200 || res.status === 201) {
      await db.photos.update(photo.id, { uploaded: 1 });
      setStatus(photo.id, null);
    } else if (res.status === 413 || res.status === 415 || res.status === 409) {
      setStatus(photo.id, { error: res.message || 'The server refused this photo.' });
    } else {
      setStatus(photo.id, { retrying: res.message || `The server answered ${res.status}; will try again.` });
    }
  }
}

/** Runs one pass over the queue (joins a pass already running). */
export function uploadPhotosNow(): Promise<void> {
  if (running) {
    again = true;
    return running;
  }
  running = (async () => {
    do {
      again = false;
      if (typeof navigator !== 'undefined' && !navigator.onLine) break;
      await round();
    } while (again);
  })().finally(() => {
    running = null;
  });
  return running;
}

let started = false;

/** Starts the queue once per page: on reconnect, every few seconds while photos wait. */
export function startPhotoUploads(): void {
  if (started) return;
  started = true;
  window.addEventListener('online', () => void uploadPhotosNow());
  setInterval(() => {
    void db.photos
      .where('uploaded')
      .equals(0)
      .count()
      .then((n) => {
        if (n > 0) void uploadPhotosNow();
      });
  }, 4000);
  void uploadPhotosNow();
}
