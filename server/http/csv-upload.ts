import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import { AppError } from './app-error.ts';

/**
 * One CSV file in the multipart field "file", held in memory only (never written to disk), at most
 * `maxBytes`; multer's own errors become API errors that say what to do. `tooLarge` tells the
 * user how to make a smaller file.
 */
export function csvUpload(options: { maxBytes: number; fields: number; fieldSize: number; tooLarge: string }): RequestHandler {
  const { maxBytes } = options;
  const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: options.fields, fieldSize: options.fieldSize } }).single('file');
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      if (!error) return next();
      if (error instanceof multer.MulterError) {
        if (error.code === 'LIMIT_FILE_SIZE') return next(new AppError('payload_too_large', `The file is larger than ${Math.round(maxBytes / 1_000_000)} MB. ${options.tooLarge}`));
        if (error.code === 'LIMIT_UNEXPECTED_FILE') return next(new AppError('bad_request', `Send one CSV file in the form field "file" (got field "${error.field ?? ''}").`));
        return next(new AppError('bad_request', `The upload was refused: ${error.message}.`));
      }
      next(new AppError('bad_request', 'The upload could not be read as multipart/form-data. Send the CSV in the form field "file".'));
    });
  };
}

/** The uploaded CSV as text; `what` names the file in the message when none was attached. */
export function csvText(req: Request, what = 'the CSV file'): { text: string; fileName: string } {
  const file = req.file;
  if (!file) throw new AppError('bad_request', `Attach ${what} as multipart/form-data in the form field "file".`);
  const text = file.buffer.toString('utf8');
  if (text.includes('\u0000')) throw new AppError('validation_failed', `${file.originalname} is not a text file. Save it as CSV (comma-separated values, UTF-8).`);
  return { text, fileName: file.originalname };
}
