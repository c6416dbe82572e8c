/** Every client URL in one place. `path` is the router pattern; `getHref` builds a link. */
export const paths = {
  signIn: {
    path: '/sign-in',
    getHref: (redirectTo?: string | null) =>
      `/sign-in${redirectTo ? `?redirectTo=${encodeURIComponent(redirectTo)}` : ''}`,
  },
  acceptInvite: {
    path: '/invite/:token',
    getHref: (token: string) => `/invite/${encodeURIComponent(token)}`,
  },
  requestReset: { path: '/reset-password', getHref: () => '/reset-password' },
  completeReset: {
    path: '/reset-password/:token',
    getHref: (token: string) => `/reset-password/${encodeURIComponent(token)}`,
  },
  notebooks: { path: '/', getHref: () => '/' },
  notebook: { path: '/notebooks/:notebookId', getHref: (id: string) => `/notebooks/${id}` },
  entry: {
    path: '/notebooks/:notebookId/entries/:entryId',
    getHref: (notebookId: string, entryId: string) => `/notebooks/${notebookId}/entries/${entryId}`,
  },
  entryReview: {
    path: '/notebooks/:notebookId/entries/:entryId/review',
    getHref: (notebookId: string, entryId: string) => `/notebooks/${notebookId}/entries/${entryId}/review`,
  },
  entryCompare: {
    path: '/notebooks/:notebookId/entries/:entryId/compare',
    getHref: (notebookId: string, entryId: string, from?: string, to?: string) =>
      `/notebooks/${notebookId}/entries/${entryId}/compare${from && to ? `?from=${encodeURIComponent(from)}&to=${encodeURIComponent(to)}` : ''}`,
  },
  reviewQueue: { path: '/reviews', getHref: () => '/reviews' },
  search: { path: '/search', getHref: () => '/search' },
  methods: { path: '/methods', getHref: (section?: string) => `/methods${section ? `#${section}` : ''}` },
  audit: {
    path: '/audit',
    getHref: (filter: { notebookId?: string; entryId?: string; actorId?: string } = {}) => {
      const q = new URLSearchParams(Object.entries(filter).filter(([, v]) => v) as [string, string][]).toString();
      return `/audit${q ? `?${q}` : ''}`;
    },
  },
  account: { path: '/account', getHref: () => '/account' },
  adminUsers: { path: '/admin/users', getHref: () => '/admin/users' },
  adminInvites: { path: '/admin/invites', getHref: () => '/admin/invites' },
  outbox: { path: '/dev/outbox', getHref: () => '/dev/outbox' },
  outboxMessage: {
    path: '/dev/outbox/:messageId',
    getHref: (id: string) => `/dev/outbox/${encodeURIComponent(id)}`,
  },
} as const;

/** Only same-site paths may be used as a return address after sign-in. */
export function safeRedirect(target: string | null | undefined): string {
  if (!target || !target.startsWith('/') || target.startsWith('//') || target.startsWith('/\\'))
    return paths.notebooks.getHref();
  if (target.startsWith(paths.signIn.path)) return paths.notebooks.getHref();
  return target;
}
