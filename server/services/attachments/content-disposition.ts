/**
 * A Content-Disposition header value for a stored name: an ASCII fallback with quotes and
 * backslashes removed, plus the exact name in RFC 6266 / RFC 8187 `filename*` form.
 */
export function contentDisposition(name: string, disposition: 'inline' | 'attachment' = 'attachment'): string {
  const fallback = name.replace(/[^\x20-\x7e]/g, '_').replace(/["\\]/g, '_') || 'file';
  const encoded = encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);
  return `${disposition}; filename="${fallback}"; filename*=UTF-8''${encoded}`;
}
