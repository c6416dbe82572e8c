/**
 * Canonical JSON: object keys sorted (by UTF-16 code unit order), no whitespace, arrays kept
 * in order, `undefined` members dropped (as `JSON.stringify` does). Two values that are equal
 * as data give the same string, whatever the order their keys were written in. Pure: hashing
 * is done by the caller (node:crypto on the server, `crypto.subtle.digest` in the browser).
 *
 * Non-finite numbers are refused: JSON has no spelling for them and a silent `null` would make
 * two different requests hash alike.
 */
export function canonicalJson(value: unknown): string {
  if (value === null) return 'null';
  switch (typeof value) {
    case 'number':
      if (!Number.isFinite(value)) throw new TypeError(`canonicalJson: ${value} has no JSON form`);
      return JSON.stringify(value);
    case 'string':
    case 'boolean':
      return JSON.stringify(value);
    case 'object': {
      if (Array.isArray(value)) {
        return `[${value.map((v) => (v === undefined || typeof v === 'function' ? 'null' : canonicalJson(v))).join(',')}]`;
      }
      const obj = value as Record<string, unknown>;
      if (typeof (obj as { toJSON?: unknown }).toJSON === 'function') {
        return canonicalJson((obj as { toJSON: () => unknown }).toJSON());
      }
      const keys = Object.keys(obj)
        .filter((k) => obj[k] !== undefined && typeof obj[k] !== 'function')
        .sort();
      return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
    }
    default:
      throw new TypeError(`canonicalJson: a ${typeof value} has no JSON form`);
  }
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
