/**
 * Roles. Site roles govern administration of the installation; notebook roles govern
 * what a person may do inside one notebook (a study).
 */
export const SITE_ROLES = ['administrator', 'member'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

/**
 * - pi: principal investigator; reviews, approves (signs) and manages members.
 * - researcher: writes entries, runs cells, records revisions, submits for review.
 * - reader: reads and comments.
 */
export const NOTEBOOK_ROLES = ['pi', 'researcher', 'reader'] as const;
export type NotebookRole = (typeof NOTEBOOK_ROLES)[number];

export const NOTEBOOK_ROLE_LABELS: Record<NotebookRole, string> = {
  pi: 'Principal investigator',
  researcher: 'Researcher',
  reader: 'Reader',
};

export const SITE_ROLE_LABELS: Record<SiteRole, string> = {
  administrator: 'Administrator',
  member: 'Member',
};
