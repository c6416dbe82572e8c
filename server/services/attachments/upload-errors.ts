import { UPLOAD_ERROR_CODES } from '@shared/api/attachments.ts';
import { HttpError, type FieldProblem } from '@server/errors/http.error.ts';

/** 415: the bytes are not one of the accepted kinds, or not the kind the file name or part type claims. */
export class UnsupportedFileError extends HttpError {
  constructor(message: string, mismatch = false) {
    const fields: FieldProblem[] = [{ path: 'file', message }];
    super(415, mismatch ? UPLOAD_ERROR_CODES.typeMismatch : UPLOAD_ERROR_CODES.unsupportedType, message, fields);
  }
}

/** 503: file storage could not be reached; nothing was kept. */
export class StorageUnavailableError extends HttpError {
  constructor(message = 'File storage is not reachable right now, so the file was not saved. Try again in a moment.') {
    super(503, UPLOAD_ERROR_CODES.storageUnavailable, message);
  }
}
