/**
 * @mentions in comment text. A member is mentioned by "@" followed by their full name
 * ("@Maren Holt"), their first name ("@Maren") when no other member shares it, or the
 * local part of their e-mail ("@maren.holt"), case-insensitive, ending at a non-name
 * character. Pure function: members in, mentioned user ids out.
 */
export interface Mentionable {
  id: string;
  name: string;
  email: string;
}

function esc(s: string) {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}

export function findMentions(body: string, members: readonly Mentionable[]): string[] {
  if (!body.includes('@')) return [];
  const firstCount = new Map<string, number>();
  for (const m of members) {
    const f = m.name.trim().split(/\s+/)[0]?.toLowerCase();
    if (f) firstCount.set(f, (firstCount.get(f) ?? 0) + 1);
  }
  const out: string[] = [];
  for (const m of members) {
    const handles = new Set<string>();
    const full = m.name.trim().toLowerCase();
    if (full) handles.add(full);
    const first = full.split(/\s+/)[0];
    if (first && firstCount.get(first) === 1) handles.add(first);
    const local = m.email.split('@')[0]?.toLowerCase();
    if (local) handles.add(local);
    const hit = [...handles].some((h) => new RegExp(`(^|[^\\w@])@${esc(h)}(?![\\w-]|\\.[\\w])`, 'iu').test(body));
    if (hit) out.push(m.id);
  }
  return out;
}
