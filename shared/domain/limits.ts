/** Limits shared by client forms and server validation. One place, documented. */
export const LIMITS = {
  /** Display names of people. */
  nameMax: 120,
  /** E-mail addresses (RFC 5321 path limit). */
  emailMax: 254,
  /** Passwords: at least 10 characters; at most 200 (the hash input stays bounded). */
  passwordMin: 10,
  passwordMax: 200,
  /** Notebook titles and descriptions. */
  notebookTitleMax: 160,
  notebookDescriptionMax: 4000,
  /** JSON request bodies accepted by the API (entries with results can be large). */
  jsonBodyBytes: 5 * 1024 * 1024,
  /** Invite and password-reset links stay valid this long. */
  inviteTtlHours: 72,
  resetTtlHours: 2,
} as const;
