import multer, { type Options } from "multer";
import type { RequestHandler } from "express";

/**
 * One multipart file part held in memory, at most `maxBytes`. Both uploads (config import, evaluation evidence) use this,
 * so an oversize file is answered in one place (error-middleware.ts), naming the part and the limit. The status differs by
 * contract: the config import answers 413 above its limit (fixed since the first API contract), the evidence upload 400
 * (issue 12 lists "a 50 MB file" among bad input answered with 400). Limit and status ride on res.locals.
 */
export function singleFileUpload(
  field: string,
  maxBytes: number,
  options: Pick<Options, "fileFilter"> & { fields?: number; fieldSize?: number; oversizeStatus?: 400 | 413 } = {},
): RequestHandler[] {
  const parse = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: options.fields ?? 4, fieldSize: options.fieldSize },
    fileFilter: options.fileFilter,
  }).single(field);
  const noteLimit: RequestHandler = (_req, res, next) => {
    res.locals.uploadLimitBytes = maxBytes;
    res.locals.uploadOversizeStatus = options.oversizeStatus ?? 400;
    next();
  };
  return [noteLimit, parse];
}

/** "1 MB", "5 MB", "512 KB": the limit as people read it. */
export const sizeLabel = (bytes: number) =>
  bytes >= 1024 * 1024 ? `${+(bytes / 1024 / 1024).toFixed(1)} MB` : `${Math.ceil(bytes / 1024)} KB`;
