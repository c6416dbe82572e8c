import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { auditPageSchema, type AuditQueryInput } from '@shared/api/audit.ts';
import { api } from '@/lib/api-client.ts';

/** The query string of an audit request; empty filters are left out. */
export function auditSearch(query: AuditQueryInput): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(query)) if (v !== undefined && v !== '' && v !== null) params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}

/** One page of the audit trail, filtered. */
export const getAudit = (query: AuditQueryInput) => api.get(`/api/audit${auditSearch({ ...query, format: undefined })}`, auditPageSchema);

/** The same filter as CSV (every matching row): a plain link, downloaded by the browser with the session cookie. */
export const auditCsvHref = (query: AuditQueryInput) => `/api/audit${auditSearch({ ...query, page: undefined, pageSize: undefined, format: 'csv' })}`;

export const getAuditQueryOptions = (query: AuditQueryInput) =>
  queryOptions({ queryKey: ['audit', query], queryFn: () => getAudit(query), placeholderData: keepPreviousData });

export const useAudit = (query: AuditQueryInput) => useQuery(getAuditQueryOptions(query));
