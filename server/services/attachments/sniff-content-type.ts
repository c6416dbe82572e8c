import type { AttachmentType } from '@shared/api/attachments.ts';

/** Bytes needed to recognise every binary kind below. */
export const SNIFF_BYTES = 16;

interface Signature {
  type: AttachmentType;
  /** Byte pattern; null matches any byte. */
  bytes: (number | null)[];
}

const ascii = (s: string) => [...s].map((c) => c.charCodeAt(0));

/**
 * Magic numbers (common practice; the same prefixes the WHATWG MIME Sniffing Standard, §6.1
 * "Matching an image type pattern", lists for PNG, JPEG, GIF and WebP, and PDF's "%PDF-" header
 * from ISO 32000-1 §7.5.2).
 */
const SIGNATURES: Signature[] = [
  { type: 'image/png', bytes: [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a] },
  { type: 'image/jpeg', bytes: [0xff, 0xd8, 0xff] },
  { type: 'image/gif', bytes: ascii('GIF87a') },
  { type: 'image/gif', bytes: ascii('GIF89a') },
  { type: 'image/webp', bytes: [...ascii('RIFF'), null, null, null, null, ...ascii('WEBP')] },
  { type: 'application/pdf', bytes: ascii('%PDF-') },
];

/** The binary kind whose signature starts `head`, or null. */
export function binaryTypeOf(head: Uint8Array): AttachmentType | null {
  for (const sig of SIGNATURES) {
    if (head.length >= sig.bytes.length && sig.bytes.every((b, i) => b === null || head[i] === b)) return sig.type;
  }
  return null;
}

/**
 * Checks, chunk by chunk, that a stream is text: valid UTF-8 with no NUL and no control
 * characters other than tab, line feed, carriage return and form feed.
 */
export class TextChecker {
  private readonly decoder = new TextDecoder('utf-8', { fatal: true });
  private ok = true;

  push(chunk: Uint8Array): void {
    if (!this.ok) return;
    try {
      this.check(this.decoder.decode(chunk, { stream: true }));
    } catch {
      this.ok = false;
    }
  }

  /** True when every chunk so far (and the end) was text. */
  finish(): boolean {
    if (!this.ok) return false;
    try {
      this.check(this.decoder.decode());
    } catch {
      this.ok = false;
    }
    return this.ok;
  }

  private check(text: string): void {
    // eslint-disable-next-line no-control-regex
    if (/[\u0000-\u0008\u000b\u000e-\u001f\u007f]/.test(text)) this.ok = false;
  }
}

/** What the name or the part's declared type claims the file is. */
export function claimedTypeOf(name: string, declared: string | undefined): AttachmentType | 'other' | null {
  const ext = /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase();
  const byExt: Record<string, AttachmentType> = {
    png: 'image/png',
    jpg: 'image/jpeg',
    jpeg: 'image/jpeg',
    gif: 'image/gif',
    webp: 'image/webp',
    pdf: 'application/pdf',
    csv: 'text/csv',
    txt: 'text/plain',
  };
  if (ext) return byExt[ext] ?? 'other';
  const d = declared?.split(';')[0].trim().toLowerCase();
  if (!d || d === 'application/octet-stream') return null;
  return (Object.values(byExt) as string[]).includes(d) ? (d as AttachmentType) : 'other';
}

/**
 * The stored type, decided from the bytes: a binary signature, or text (CSV when the name or
 * declared type says CSV, plain text otherwise). Returns an error message when the bytes are not
 * an accepted kind or disagree with the name.
 */
export function decideType(
  head: Uint8Array,
  isText: boolean,
  claimed: AttachmentType | 'other' | null,
): { type: AttachmentType } | { error: string; mismatch: boolean } {
  const binary = binaryTypeOf(head);
  const detected: AttachmentType | null = binary ?? (isText ? (claimed === 'text/csv' ? 'text/csv' : 'text/plain') : null);
  if (!detected) {
    return { error: 'This file is not an accepted kind: attach PNG, JPEG, GIF or WebP images, PDF, CSV or plain text', mismatch: false };
  }
  if (claimed === 'other') {
    return { error: `The file name says another kind of file, but its contents are ${describe(detected)}`, mismatch: true };
  }
  if (claimed && claimed !== detected && !(claimed.startsWith('text/') && detected.startsWith('text/'))) {
    return { error: `The file name says ${describe(claimed)}, but its contents are ${describe(detected)}`, mismatch: true };
  }
  return { type: detected };
}

function describe(type: AttachmentType): string {
  const names: Record<AttachmentType, string> = {
    'image/png': 'a PNG image',
    'image/jpeg': 'a JPEG image',
    'image/gif': 'a GIF image',
    'image/webp': 'a WebP image',
    'application/pdf': 'a PDF document',
    'text/csv': 'CSV text',
    'text/plain': 'plain text',
  };
  return names[type];
}
