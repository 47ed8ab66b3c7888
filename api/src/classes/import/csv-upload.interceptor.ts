import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  Injectable,
  PayloadTooLargeException,
  type CallHandler,
  type ExecutionContext,
  type NestInterceptor,
} from '@nestjs/common';
import type { Request, Response } from 'express';
import multer from 'multer';
import { catchError, concatMap, type Observable } from 'rxjs';
import { CLASS_IMPORT_MAX_BYTES } from '@stavemark/shared';
import { invalid } from '../../common/errors.js';

/** Where uploads wait while they are checked; each request gets its own folder inside. */
export const UPLOAD_TEMP_PREFIX = join(tmpdir(), 'stavemark-upload-');

/**
 * Reads the multipart field `file` to a temporary file on disk (design.md §6: uploads are
 * streamed, not held in memory), answering clear errors for a missing, extra or oversized file.
 * The file's folder is removed when the request ends, whatever happened (refused, failed, done).
 */
@Injectable()
export class CsvUploadInterceptor implements NestInterceptor {
  async intercept(context: ExecutionContext, next: CallHandler): Promise<Observable<unknown>> {
    const http = context.switchToHttp();
    const req = http.getRequest<Request>();
    const dir = await mkdtemp(UPLOAD_TEMP_PREFIX);
    const cleanUp = () => rm(dir, { recursive: true, force: true }).catch(() => undefined);
    const upload = multer({
      storage: multer.diskStorage({
        destination: dir,
        filename: (_req, _file, cb) => cb(null, 'upload.csv'),
      }),
      limits: { fileSize: CLASS_IMPORT_MAX_BYTES, files: 1, fields: 5, parts: 6 },
    }).single('file');
    try {
      await new Promise<void>((resolve, reject) => {
        upload(req, http.getResponse<Response>(), (err: unknown) => {
          if (!err) return resolve();
          if (err instanceof multer.MulterError) {
            if (err.code === 'LIMIT_FILE_SIZE') {
              return reject(
                new PayloadTooLargeException(
                  `The file is larger than ${CLASS_IMPORT_MAX_BYTES / 1024 / 1024} MB, the limit per import. Split the class list into smaller files.`,
                ),
              );
            }
            if (err.code === 'LIMIT_UNEXPECTED_FILE' || err.code === 'LIMIT_FILE_COUNT') {
              return reject(
                invalid('Send one file, in the form field named “file”.', [
                  { path: 'file', message: 'one file expected' },
                ]),
              );
            }
            return reject(invalid(`The upload could not be read: ${err.message}.`));
          }
          reject(
            invalid(
              'The upload could not be read. Send the CSV as multipart/form-data in the field “file”.',
            ),
          );
        });
      });
      if (!req.file)
        throw invalid('Choose a CSV file to upload (form field “file”).', [
          { path: 'file', message: 'missing' },
        ]);
    } catch (err) {
      await cleanUp();
      throw err;
    }
    // Removed before the answer goes out, after a result or an error alike.
    return next.handle().pipe(
      concatMap(async (result: unknown) => {
        await cleanUp();
        return result;
      }),
      catchError(async (err: unknown) => {
        await cleanUp();
        throw err;
      }),
    );
  }
}
