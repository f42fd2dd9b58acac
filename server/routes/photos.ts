/** Photos: upload (multipart, idempotent by the device-made id), read back (own organisation only), list per survey. */
import type { RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { PHOTO_MAX_BYTES, PhotoUploadFieldsSchema } from '@shared/api/photos';
import { ANY_MEMBER, authOf, type RouteSpec } from '../http/route';
import { badRequest, tooLarge } from '../errors';
import type { PhotoService } from '../services/photos';

const IdParam = z.object({ id: z.uuid() });

/** multer in memory, one file, 15 MB; its errors become readable API errors. */
function fileUpload(): RequestHandler {
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: PHOTO_MAX_BYTES, files: 1, fields: 10 } }).single('file');
  return (req, res, next) =>
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(tooLarge(`The photo is larger than ${PHOTO_MAX_BYTES / 1024 / 1024} MB. Send a smaller image.`));
        }
        return next(badRequest(`The upload is not valid: ${err.message}.`));
      }
      // Anything else the multipart parser throws is about the body it was sent (cut short, no
      // boundary, a malformed part header): the client's to fix, never a server fault.
      next(badRequest(`The upload is not a complete multipart form: ${err instanceof Error ? err.message : String(err)}. Send the photo again.`));
    });
}

export function photoRoutes(photos: PhotoService): RouteSpec[] {
  return [
    {
      method: 'put',
      path: '/photos/:id',
      policy: ANY_MEMBER,
      before: [fileUpload()],
      handler: async (req, res) => {
        const { id } = IdParam.parse(req.params);
        if (!req.file) throw badRequest('Send the photo as the multipart field "file".');
        const fields = PhotoUploadFieldsSchema.parse(req.body ?? {});
        const { photo, created } = await photos.upload(authOf(req), id, fields, req.file.buffer);
        res.status(created ? 201 : 200).json(photo);
      },
    },
    {
      method: 'get',
      path: '/photos/:id',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const { id } = IdParam.parse(req.params);
        const { photo, object } = await photos.read(authOf(req), id);
        res.setHeader('Content-Type', photo.contentType);
        res.setHeader('Cache-Control', 'private, max-age=86400');
        res.setHeader('Content-Length', String(object.contentLength ?? photo.sizeBytes));
        object.body.pipe(res);
      },
    },
    {
      method: 'get',
      path: '/surveys/:id/photos',
      policy: ANY_MEMBER,
      handler: async (req, res) => {
        const { id } = IdParam.parse(req.params);
        res.json({ items: await photos.list(authOf(req), id) });
      },
    },
  ];
}
