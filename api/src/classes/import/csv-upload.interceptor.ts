import {
  Injectable,
  PayloadTooLargeException,
  type CallHandler,
  type ExecutionContext,
  type NestInterceptor,
} from '@nestjs/common';
import type { Request, Response } from 'express';
import multer from 'multer';
import type { Observable } from 'rxjs';
import { CLASS_IMPORT_MAX_BYTES } from '@stavemark/shared';
import { invalid } from '../../common/errors.js';

// In memory: a class list is at most 2 MB, and the bytes are checked for text before anything
// else happens. One file, no other file fields.
const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: CLASS_IMPORT_MAX_BYTES, files: 1, fields: 5, parts: 6 },
}).single('file');

/** Reads the multipart field `file`, answering clear errors for a missing, extra or oversized file. */
@Injectable()
export class CsvUploadInterceptor implements NestInterceptor {
  async intercept(context: ExecutionContext, next: CallHandler): Promise<Observable<unknown>> {
    const http = context.switchToHttp();
    const req = http.getRequest<Request>();
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
    return next.handle();
  }
}
