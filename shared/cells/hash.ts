/**
 * Canonical JSON: object keys sorted (by UTF-16 code unit order), no whitespace, arrays kept
 * in order, `undefined` members dropped (as `JSON.stringify` does). Two values that are equal
 * as data give the same string, whatever the order their keys were written in. Pure: hashing
 * is done by the caller (node:crypto on the server, `crypto.subtle.digest` in the browser).
 *
 * Non-finite numbers are refused by default: JSON has no spelling for them and a silent `null`
 * would make two different requests hash alike. `nonFinite: 'null'` writes them as `null`, as
 * `JSON.stringify` and PostgreSQL's jsonb do: for hashing a value as it will be stored (the audit
 * trail hashes its summaries that way, so the chain verifies against what the database holds).
 */
export function canonicalJson(value: unknown, options: CanonicalJsonOptions = {}): string {
  const nonFinite = options.nonFinite ?? 'refuse';
  const write = (v: unknown): string => {
    if (v === null) return 'null';
    switch (typeof v) {
      case 'number':
        if (Number.isFinite(v)) return JSON.stringify(v);
        if (nonFinite === 'null') return 'null';
        throw new TypeError(`canonicalJson: ${v} has no JSON form`);
      case 'string':
      case 'boolean':
        return JSON.stringify(v);
      case 'object': {
        if (Array.isArray(v)) {
          return `[${v.map((x) => (x === undefined || typeof x === 'function' ? 'null' : write(x))).join(',')}]`;
        }
        const obj = v as Record<string, unknown>;
        if (typeof (obj as { toJSON?: unknown }).toJSON === 'function') {
          return write((obj as { toJSON: () => unknown }).toJSON());
        }
        const keys = Object.keys(obj)
          .filter((k) => obj[k] !== undefined && typeof obj[k] !== 'function')
          .sort();
        return `{${keys.map((k) => `${JSON.stringify(k)}:${write(obj[k])}`).join(',')}}`;
      }
      default:
        throw new TypeError(`canonicalJson: a ${typeof v} has no JSON form`);
    }
  };
  return write(value);
}

export interface CanonicalJsonOptions {
  /** What to do with NaN and ±Infinity: throw (default) or write `null`. */
  nonFinite?: 'refuse' | 'null';
}

/** What the input hash covers: the engine version and the resolved request. */
export function hashPayload(engineVersion: string, request: { model: unknown; task: unknown }): string {
  return canonicalJson({ engineVersion, model: request.model, task: request.task });
}

/** sha256 (hex) of the canonical payload, with the Web Crypto API (browsers and Node ≥ 20). */
export async function inputHash(
  engineVersion: string,
  request: { model: unknown; task: unknown },
): Promise<string> {
  const bytes = new TextEncoder().encode(hashPayload(engineVersion, request));
  const digest = await globalThis.crypto.subtle.digest('SHA-256', bytes);
  return Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, '0')).join('');
}
