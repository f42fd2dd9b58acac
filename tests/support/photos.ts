/** Photo fixtures: tiny real images made in memory, and a photo stored in a test organisation. */
import { randomUUID } from 'node:crypto';
import { deflateSync } from 'node:zlib';
import type { TestApp } from './app';
import type { TestOrg } from './auth';
import { storeSurvey } from './surveys';
import { createPhotoService } from '../../server/services/photos';
import { createS3PhotoStorage } from '../../server/storage/photo-store';

function crc32(buf: Buffer): number {
  let c = ~0;
  for (const b of buf) {
    c ^= b;
    for (let k = 0; k < 8; k++) c = (c >>> 1) ^ (0xedb88320 & -(c & 1));
  }
  return ~c >>> 0;
}

function chunk(type: string, data: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}

/** A valid RGB PNG of w × h pixels in a diagonal gradient (PNG spec, ISO/IEC 15948). */
export function makePng(w = 16, h = 12): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(w, 0);
  ihdr.writeUInt32BE(h, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type RGB
  const raw = Buffer.alloc((w * 3 + 1) * h);
  for (let y = 0; y < h; y++) {
    raw[y * (w * 3 + 1)] = 0;
    for (let x = 0; x < w; x++) {
      const o = y * (w * 3 + 1) + 1 + x * 3;
      raw[o] = (x * 255) / w;
      raw[o + 1] = (y * 255) / h;
      raw[o + 2] = 128;
    }
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** Stores a PNG photo on a new survey of the organisation's surveyor; returns the photo id. */
export async function storedPhoto(t: TestApp, org: TestOrg): Promise<string> {
  const survey = await storeSurvey(t.db, org.surveyor);
  const id = randomUUID();
  const m = org.surveyor;
  await createPhotoService({ db: t.db, storage: createS3PhotoStorage(t.config) }).upload(
    { userId: m.id, orgId: m.orgId, role: m.role, email: m.email },
    id,
    { surveyId: survey.id, entityKind: 'survey', entityId: survey.id, caption: 'matrix' },
    makePng(),
  );
  return id;
}
