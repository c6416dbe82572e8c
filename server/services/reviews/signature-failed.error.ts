import { HttpError } from '@server/errors/http.error.ts';

/** 401 with code "signature_failed": the password typed to sign was wrong (21 CFR Part 11 §11.200(a)). */
export class SignatureFailedError extends HttpError {
  constructor() {
    super(401, 'signature_failed', 'The password is not correct; the revision was not signed', [
      { path: 'password', message: 'Not your current password' },
    ]);
  }
}
