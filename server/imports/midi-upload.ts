import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from '../http-error';

/** Largest MIDI file accepted: grooves of 64 bars are a few kilobytes. */
export const MIDI_LIMIT_BYTES = 1024 * 1024;

const MULTER_MESSAGES: Record<string, string> = {
  LIMIT_FILE_SIZE: 'A MIDI file may be at most 1 MB.',
  LIMIT_FILE_COUNT: 'Send one MIDI file at a time.',
  LIMIT_UNEXPECTED_FILE: 'Send the MIDI file in the form field "file", one file only.',
};

/**
 * Reads a multipart upload into memory: one file in the field `file` (at most 1 MB) and a few
 * short text fields. Every problem with the upload itself (too large, another field, a broken
 * multipart body) answers 400 with a sentence; a request without a file is refused too.
 */
export function midiUpload(): RequestHandler {
  const parse = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: MIDI_LIMIT_BYTES, files: 1, fields: 8, fieldSize: 8 * 1024, parts: 10 },
  }).single('file');
  return (req, res, next) => {
    parse(req, res, (error?: unknown) => {
      if (error) {
        const code = (error as { code?: unknown }).code;
        const known = typeof code === 'string' ? MULTER_MESSAGES[code] : undefined;
        const detail = error instanceof Error ? error.message : String(error);
        const message = known ?? `The upload could not be read (${detail}).`;
        next(
          new HttpError(
            400,
            code === 'LIMIT_FILE_SIZE' ? 'file_too_large' : 'invalid_upload',
            message,
            [{ path: 'body.file', message }],
          ),
        );
        return;
      }
      if (!req.file) {
        const message = 'Choose a MIDI file to upload (form field "file").';
        next(new HttpError(400, 'file_missing', message, [{ path: 'body.file', message }]));
        return;
      }
      next();
    });
  };
}
