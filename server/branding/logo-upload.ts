import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from '../http-error';
import { LOGO_LIMIT_BYTES } from './logo-image';

const MULTER_MESSAGES: Record<string, string> = {
  LIMIT_FILE_SIZE: 'A logo may be at most 1 MB.',
  LIMIT_FILE_COUNT: 'Send one logo at a time.',
  LIMIT_UNEXPECTED_FILE: 'Send the logo in the form field "logo", one file only.',
};

/**
 * Reads one image into memory from the multipart field `logo` (at most 1 MB). Every problem with
 * the upload itself answers 400 with a sentence; so does a request without a file.
 */
export function logoUpload(): RequestHandler {
  const parse = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: LOGO_LIMIT_BYTES, files: 1, fields: 2, fieldSize: 1024, parts: 3 },
  }).single('logo');
  return (req, res, next) => {
    parse(req, res, (error?: unknown) => {
      if (error) {
        const code = (error as { code?: unknown }).code;
        const known = typeof code === 'string' ? MULTER_MESSAGES[code] : undefined;
        const detail = error instanceof Error ? error.message : String(error);
        const message = known ?? `The upload could not be read (${detail}).`;
        const status = code === 'LIMIT_FILE_SIZE' ? 'logo_too_large' : 'invalid_upload';
        next(new HttpError(400, status, message, [{ path: 'body.logo', message }]));
        return;
      }
      if (!req.file) {
        const message = 'Choose a PNG or JPEG image to upload (form field "logo").';
        next(new HttpError(400, 'logo_missing', message, [{ path: 'body.logo', message }]));
        return;
      }
      next();
    });
  };
}
