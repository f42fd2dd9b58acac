/** "Photos": attach photos to a space or plate, offline; they upload when the survey has synced. */
import { useEffect, useId, useMemo, useRef, useState } from 'react';
import { useLiveQuery } from 'dexie-react-hooks';
import { db, type LocalPhoto } from '@client/offline/db';
import { ServerPhoto, useObjectUrl } from '@client/components/photos/server-photo';
import type { PhotoRef } from '@shared/schemas/survey';
import type { SectionProps } from '../utils/types';
import { dangerBtn, inputCls, primaryBtn, secondaryBtn } from '@client/components/ui/fields';
import { LongSelect } from '@client/components/ui/long-select';
import { newId } from '../utils/new-entities';
import { startPhotoUploads, uploadPhotosNow, usePhotoUploadStatus } from '../api/upload-photos';

function LocalThumb({ photo, alt }: { photo: LocalPhoto; alt: string }) {
  const url = useObjectUrl(photo.blob);
  return <img src={url} alt={alt} className="h-32 w-full object-cover" />;
}

export function PhotosSection({ survey, apply, selectedId }: SectionProps) {
  const local = useLiveQuery(() => db.photos.where('surveyId').equals(survey.id).toArray(), [survey.id]);
  const status = usePhotoUploadStatus();
  const targets = useMemo(
    () => [
      ...survey.compartments.map((c) => ({ value: `compartment:${c.id}`, label: `Space: ${c.name}` })),
      ...survey.boundaries.map((b) => ({ value: `boundary:${b.id}`, label: `Boundary: ${b.name}` })),
      { value: `survey:${survey.id}`, label: 'The survey as a whole' },
    ],
    [survey],
  );
  const initial = targets.find((t) => t.value.endsWith(`:${selectedId}`))?.value ?? targets[0].value;
  const [target, setTarget] = useState(initial);
  const [caption, setCaption] = useState('');
  const [error, setError] = useState<string | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const fileRef = useRef<HTMLInputElement>(null);
  const ids = { target: useId(), caption: useId(), file: useId() };
  useEffect(() => startPhotoUploads(), []);

  const attach = async (file: File) => {
    setError(null);
    if (!file.type.startsWith('image/')) {
      setError('That file is not an image.');
      return;
    }
    const [kind, id] = target.split(':') as [PhotoRef['entity']['kind'], string];
    const photo: LocalPhoto = {
      id: newId(),
      surveyId: survey.id,
      entity: { kind, id },
      blob: file,
      contentType: file.type,
      caption: caption.trim(),
      uploaded: 0,
      createdAt: new Date().toISOString(),
    };
    try {
      await db.photos.add(photo);
      await apply({ kind: 'upsert', collection: 'photos', entity: { id: photo.id, entity: photo.entity, caption: photo.caption, contentType: file.type.toLowerCase() } });
      setCaption('');
      void uploadPhotosNow();
    } catch (err) {
      setError(err instanceof Error ? err.message : 'The photo could not be kept on this device.');
    }
  };

  /**
   * Takes the photo out of the survey (a delete that syncs like any edit). The copy on this device
   * goes too, so a photo not yet uploaded never is; one already uploaded stays on the server with
   * the survey's history.
   */
  const remove = async (id: string) => {
    setError(null);
    try {
      await apply({ kind: 'delete', collection: 'photos', entityId: id });
      await db.photos.delete(id);
      setConfirming(null);
    } catch (err) {
      setError(err instanceof Error ? err.message : 'The photo could not be removed.');
    }
  };

  const nameOf = (e: PhotoRef['entity']) =>
    e.kind === 'compartment' ? survey.compartments.find((c) => c.id === e.id)?.name : e.kind === 'boundary' ? survey.boundaries.find((b) => b.id === e.id)?.name : 'Survey';
  const refs = survey.photos ?? [];
  const byId = new Map((local ?? []).map((p) => [p.id, p]));

  return (
    <section aria-labelledby="photos-h" className="space-y-4">
      <h2 id="photos-h" className="text-2xl">
        Photos
      </h2>
      <div className="grid gap-3 rounded-lg border border-line bg-card p-3 sm:grid-cols-2">
        <div>
          <label htmlFor={ids.target} className="block text-sm font-bold">
            Of
          </label>
          <LongSelect id={ids.target} className={`${inputCls} mt-0.5`} options={targets} value={target} onChange={setTarget} />
        </div>
        <div>
          <label htmlFor={ids.caption} className="block text-sm font-bold">
            Caption
          </label>
          <input id={ids.caption} className={`${inputCls} mt-0.5`} value={caption} onChange={(e) => setCaption(e.target.value)} placeholder="e.g. Buckled stiffener, frame 112" />
        </div>
        <div className="sm:col-span-2">
          <button type="button" className={primaryBtn} onClick={() => fileRef.current?.click()}>
            Take or choose a photo
          </button>
          <input
            id={ids.file}
            ref={fileRef}
            type="file"
            accept="image/*"
            className="sr-only"
            aria-label="Photo file"
            data-testid="photo-input"
            onChange={(e) => {
              const f = e.target.files?.[0];
              e.target.value = '';
              if (f) void attach(f);
            }}
          />
          <p className="mt-1 text-xs text-ink-soft">Kept on this device at once; uploaded after the survey syncs. JPEG, PNG, WebP or HEIC, up to 15 MB.</p>
        </div>
        {error && (
          <p className="font-bold text-danger sm:col-span-2" role="alert">
            {error}
          </p>
        )}
      </div>
      {refs.length === 0 ? (
        <p className="text-ink-soft">No photos yet.</p>
      ) : (
        <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" aria-label="Photos of this survey">
          {refs.map((r) => {
            const lp = byId.get(r.id);
            const st = status[r.id];
            const alt = r.caption || `Photo of ${nameOf(r.entity) ?? 'the survey'}`;
            const state = lp
              ? lp.uploaded
                ? 'Uploaded'
                : st?.error
                  ? st.error
                  : st?.progress !== undefined
                    ? `Uploading ${Math.round(st.progress * 100)} %`
                    : (st?.retrying ?? 'On this device, waiting to upload')
              : 'On the server';
            return (
              <li key={r.id} className="overflow-hidden rounded-lg border border-line bg-card" data-testid="photo-card" data-uploaded={lp ? String(lp.uploaded === 1) : 'true'}>
                {lp ? <LocalThumb photo={lp} alt={alt} /> : <ServerPhoto id={r.id} alt={alt} />}
                <div className="p-2 text-sm">
                  <p className="font-bold">{nameOf(r.entity) ?? 'Survey'}</p>
                  {r.caption && <p>{r.caption}</p>}
                  <p className={st?.error ? 'font-bold text-danger' : 'text-ink-soft'} data-testid="photo-state">
                    {state}
                  </p>
                  {st?.progress !== undefined && (
                    <progress className="w-full" max={1} value={st.progress} aria-label="Upload progress" />
                  )}
                  {confirming === r.id ? (
                    <div className="mt-2 space-y-2" role="group" aria-label="Remove this photo?">
                      <p className="font-bold">
                        Remove this photo from the survey?{' '}
                        <span className="font-normal">
                          {lp && !lp.uploaded
                            ? 'It has not been uploaded yet and will be deleted from this device.'
                            : 'The uploaded file stays on the server with the survey’s history.'}
                        </span>
                      </p>
                      <div className="flex flex-wrap gap-2">
                        <button type="button" className={dangerBtn} onClick={() => void remove(r.id)}>
                          Remove photo
                        </button>
                        <button type="button" className={secondaryBtn} onClick={() => setConfirming(null)}>
                          Keep it
                        </button>
                      </div>
                    </div>
                  ) : (
                    <button type="button" className={`${secondaryBtn} mt-2`} onClick={() => setConfirming(r.id)} aria-label={`Remove photo: ${alt}`}>
                      Remove…
                    </button>
                  )}
                </div>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
