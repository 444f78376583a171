/** True when a string holds a UTF-16 surrogate that is not part of a pair (JSON.parse accepts one; utf8mb4 cannot). */
export function hasLoneSurrogate(s: string): boolean {
  return /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/.test(s);
}

const MESSAGE = 'contains invalid Unicode (a lone surrogate)';

/**
 * Field path → message for every string (values and keys) in a parsed body or query that holds a lone surrogate.
 * Paths are dot-joined like the zod messages (`readings.a\u2026`); `prefix` names the part (`query`).
 */
export function loneSurrogateFields(value: unknown, prefix = ''): Record<string, string> {
  const fields: Record<string, string> = {};
  const safe = (s: string) => s.replace(/[\ud800-\udfff]/g, '\ufffd');
  const walk = (v: unknown, path: string[], depth: number): void => {
    if (depth > 64 || Object.keys(fields).length >= 20) return;
    const key = () => [prefix, ...path].filter(Boolean).join('.') || prefix || '(body)';
    if (typeof v === 'string') {
      if (hasLoneSurrogate(v)) fields[key()] = MESSAGE;
    } else if (Array.isArray(v)) {
      v.forEach((x, i) => walk(x, [...path, String(i)], depth + 1));
    } else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) {
        if (hasLoneSurrogate(k)) fields[[prefix, ...path, safe(k)].filter(Boolean).join('.')] = `key ${MESSAGE}`;
        else walk(x, [...path, k], depth + 1);
      }
    }
  };
  walk(value, [], 0);
  return fields;
}
