import multer, { type Options } from "multer";
import type { RequestHandler } from "express";

/**
 * One multipart file part held in memory, at most `maxBytes`. Both uploads (config import, evaluation evidence) use this,
 * so an oversize file is answered in one place (error-middleware.ts): a 400 naming the part, like any other bad file
 * (issue 12 lists "a 50 MB file" among bad input answered with 400). The limit rides on res.locals so that answer can
 * say how large a file may be.
 */
export function singleFileUpload(
  field: string,
  maxBytes: number,
  options: Pick<Options, "fileFilter"> & { fields?: number; fieldSize?: number } = {},
): RequestHandler[] {
  const parse = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: options.fields ?? 4, fieldSize: options.fieldSize },
    fileFilter: options.fileFilter,
  }).single(field);
  const noteLimit: RequestHandler = (_req, res, next) => {
    res.locals.uploadLimitBytes = maxBytes;
    next();
  };
  return [noteLimit, parse];
}

/** "1 MB", "5 MB", "512 KB": the limit as people read it. */
export const sizeLabel = (bytes: number) =>
  bytes >= 1024 * 1024 ? `${+(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.ceil(bytes / 1024)} KB`;
