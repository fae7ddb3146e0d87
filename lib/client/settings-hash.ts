/**
 * A stable hash of solve settings: canonical JSON (keys sorted, numbers as JSON writes them)
 * then SHA-256. With the section revision it identifies a solve, so the same revision and
 * settings are stored once.
 */
export function canonicalJson(v: unknown): string {
  if (v === null || typeof v !== 'object') return JSON.stringify(v) ?? 'null';
  if (Array.isArray(v)) return `[${v.map(canonicalJson).join(',')}]`;
  const o = v as Record<string, unknown>;
  return `{${Object.keys(o)
    .filter((k) => o[k] !== undefined)
    .sort()
    .map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`)
    .join(',')}}`;
}

export async function settingsHash(settings: unknown): Promise<string> {
  const bytes = new TextEncoder().encode(canonicalJson(settings));
  const digest = await crypto.subtle.digest('SHA-256', bytes);
  const hex = Array.from(new Uint8Array(digest), (b) => b.toString(16).padStart(2, '0')).join('');
  return `sha256:${hex}`;
}
