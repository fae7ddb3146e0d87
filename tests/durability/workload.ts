/**
 * The writes of one kill-and-restart round and their ledger: what was sent, and whether the
 * server acknowledged it (a complete 2xx response carrying the new row's id) before it died.
 *
 * Writers run concurrently against the real server: appenders save revisions (no base
 * revision, so concurrent saves of one section race for the next number), a creator adds
 * sections (section + first revision in one transaction), and solve pipelines store a solve
 * with its result, then upload its compressed field blob, then comment on it. Every writer
 * stops at its first network error (the server was killed).
 */
import { encodeFieldBlob, type FieldData } from '@/lib/field/codec';
import type { Section } from '@/lib/section/schema';
import { coaxSection, fakeResult } from '../integration/helpers/fixtures';
import { request, type Reply } from './harness';

export type State = 'acked' | 'unacked';

export interface RevisionSent {
  sectionName: string;
  message: string;
  content: Section;
  state: State;
  id?: string;
  number?: number;
}
export interface SectionSent {
  name: string;
  state: State;
  id?: string;
  first: RevisionSent;
}
export interface CommentSent {
  body: string;
  state: State;
  id?: string;
}
export interface SolveSent {
  settingsHash: string;
  sectionId: string;
  revisionId: string;
  result: ReturnType<typeof fakeResult>;
  state: State;
  id?: string;
  field: Uint8Array;
  fieldState: State | 'not sent';
  comments: CommentSent[];
}

export interface Ledger {
  round: number;
  prefix: string;
  sections: Map<string, SectionSent>; // by name
  revisions: Map<string, RevisionSent>; // by message
  solves: Map<string, SolveSent>; // by settingsHash
  /** Responses that arrived but were not 2xx (must stay empty). */
  refusals: string[];
  counts: { sent: number; acked: number };
}

export function newLedger(round: number): Ledger {
  return {
    round,
    prefix: `dur-r${String(round).padStart(2, '0')}-`,
    sections: new Map(),
    revisions: new Map(),
    solves: new Map(),
    refusals: [],
    counts: { sent: 0, acked: 0 },
  };
}

/** A field matching fakeResult's mesh (40 × 25 nodes, one signal net); `seed` makes it unique. */
export function fieldFor(seed: number): Uint8Array {
  const nx = 40;
  const ny = 25;
  const f: FieldData = {
    xs: new Float64Array(nx).map((_, i) => i * 1e-4),
    ys: new Float64Array(ny).map((_, j) => j * 1e-4),
    potentials: [new Float64Array(nx * ny).map((_, q) => ((q % nx) / (nx - 1)) * (1 + seed * 1e-6))],
    cellEpsR: new Float32Array((nx - 1) * (ny - 1)).fill(2.1),
    nodeNet: new Int16Array(nx * ny).fill(-1),
  };
  return encodeFieldBlob(f, 1);
}

function content(seed: number): Section {
  return coaxSection(0.3 + (seed % 997) / 10_000);
}

let seedCounter = 1;

/** Send one write; a network error means the server is gone (the caller stops). */
async function send(l: Ledger, method: string, path: string, cookie: string, opts: Parameters<typeof request>[2]) {
  l.counts.sent++;
  const r: Reply = await request(method, path, { ...opts, cookie });
  if (r.status < 200 || r.status >= 300) {
    l.refusals.push(`${method} ${path}: HTTP ${r.status} ${r.body.toString('utf8').slice(0, 200)}`);
    return null;
  }
  l.counts.acked++;
  return r;
}

export async function createSection(l: Ledger, ws: string, cookie: string, name: string): Promise<SectionSent | null> {
  const message = `${name} created`;
  const first: RevisionSent = { sectionName: name, message, content: content(seedCounter++), state: 'unacked' };
  const s: SectionSent = { name, state: 'unacked', first };
  l.sections.set(name, s);
  l.revisions.set(message, first);
  const r = await send(l, 'POST', `/api/workspaces/${ws}/sections`, cookie, {
    json: { name, content: first.content, message },
  });
  if (!r) return null;
  const j = r.json<{ section: { id: string }; revision: { id: string; number: number } }>();
  s.state = first.state = 'acked';
  s.id = j.section.id;
  first.id = j.revision.id;
  first.number = j.revision.number;
  return s;
}

/**
 * Store a solve of the newest acknowledged revision of `s` with its result, then its field
 * blob, then a comment on it (each step only after the one before was acknowledged).
 */
export async function solvePipeline(l: Ledger, ws: string, cookie: string, s: SectionSent, tag: string, withField = true): Promise<SolveSent> {
  const revs = [...l.revisions.values()].filter((r) => r.sectionName === s.name && r.state === 'acked');
  const rev = revs.sort((a, b) => b.number! - a.number!)[0] ?? s.first;
  const seed = seedCounter++;
  const sv: SolveSent = {
    settingsHash: `${l.prefix}${tag}`,
    sectionId: s.id!,
    revisionId: rev.id!,
    result: fakeResult(1e-10 * (1 + seed / 1000)),
    state: 'unacked',
    field: fieldFor(seed),
    fieldState: 'not sent',
    comments: [],
  };
  l.solves.set(sv.settingsHash, sv);
  const r = await send(l, 'POST', `/api/workspaces/${ws}/solves`, cookie, {
    json: {
      sectionId: sv.sectionId,
      revisionId: sv.revisionId,
      settings: { preset: 'standard', seed },
      settingsHash: sv.settingsHash,
      result: sv.result,
      status: 'done',
    },
  });
  if (!r) return sv;
  sv.state = 'acked';
  sv.id = r.json<{ solve: { id: string } }>().solve.id;
  if (!withField) return sv;
  sv.fieldState = 'unacked';
  const f = await send(l, 'PUT', `/api/workspaces/${ws}/solves/${sv.id}/field`, cookie, { body: sv.field });
  if (f) sv.fieldState = 'acked';
  const c: CommentSent = { body: `${l.prefix}comment on ${tag}`, state: 'unacked' };
  sv.comments.push(c);
  const cr = await send(l, 'POST', `/api/workspaces/${ws}/solves/${sv.id}/comments`, cookie, { json: { body: c.body } });
  if (cr) {
    c.state = 'acked';
    c.id = cr.json<{ comment: { id: string } }>().comment.id;
  }
  return sv;
}

/** An acknowledged solve whose field is not uploaded yet (the caller uploads it). */
export async function solvePipelineWithoutField(l: Ledger, ws: string, cookie: string, s: SectionSent): Promise<SolveSent> {
  const sv = await solvePipeline(l, ws, cookie, s, 'held', false);
  if (sv.state !== 'acked') throw new Error(`the held solve was refused: ${l.refusals.join('; ')}`);
  return sv;
}

/** Writes per kind: acknowledged, and sent but not acknowledged (in flight at the kill). */
export function tally(l: Ledger) {
  const solves = [...l.solves.values()];
  const n = (xs: { state: string }[]) => ({ acked: xs.filter((x) => x.state === 'acked').length, unacked: xs.filter((x) => x.state !== 'acked').length });
  return {
    revisions: n([...l.revisions.values()]),
    solves: n(solves),
    fields: n(solves.filter((s) => s.fieldState !== 'not sent').map((s) => ({ state: s.fieldState }))),
    comments: n(solves.flatMap((s) => s.comments)),
  };
}

/** Run the concurrent writers until the server dies; resolves when every writer has stopped. */
export async function runWriters(l: Ledger, ws: string, cookie: string, base: SectionSent[]): Promise<void> {
  const stop = { now: false };
  const guard = async (fn: () => Promise<void>) => {
    try {
      await fn();
    } catch {
      stop.now = true; // network error: the server is gone
    }
  };
  const appender = (w: number) =>
    guard(async () => {
      for (let i = 0; !stop.now; i++) {
        const s = base[(w + i) % base.length]!;
        const message = `${l.prefix}a${w}-${i}`;
        const rev: RevisionSent = { sectionName: s.name, message, content: content(seedCounter++), state: 'unacked' };
        l.revisions.set(message, rev);
        const r = await send(l, 'POST', `/api/workspaces/${ws}/sections/${s.id}/revisions`, cookie, {
          json: { content: rev.content, message },
        });
        if (!r) continue;
        const j = r.json<{ revision: { id: string; number: number } }>();
        rev.state = 'acked';
        rev.id = j.revision.id;
        rev.number = j.revision.number;
      }
    });
  const creator = () =>
    guard(async () => {
      for (let i = 0; !stop.now; i++) {
        const s = await createSection(l, ws, cookie, `${l.prefix}c${i}`);
        if (s) base.push(s);
      }
    });
  const solver = (w: number) =>
    guard(async () => {
      for (let i = 0; !stop.now; i++) await solvePipeline(l, ws, cookie, base[(w + i) % base.length]!, `s${w}-${i}`);
    });
  await Promise.all([appender(0), appender(1), appender(2), creator(), solver(0), solver(1)]);
}
