import type { Metadata } from 'next';
import Link from 'next/link';
import { notFound } from 'next/navigation';
import { Badge } from '@/components/ui/badge';
import { buttonClass } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { Time } from '@/components/ui/time';
import { MeasuredUpload } from '@/components/teamwork/measured-upload';
import { RestoreRevisionButton } from '@/components/teamwork/restore-revision-button';
import { SectionSketch, sketchFrame } from '@/components/teamwork/section-sketch';
import { ShareLinksPanel } from '@/components/teamwork/share-links-panel';
import { listSectionFiles, getSectionFile } from '@/db/queries/files';
import { getRevision, getSection, listRevisions } from '@/db/queries/sections';
import { listSolves } from '@/db/queries/solves';
import type { SectionResult } from '@/lib/engine/types';
import { parseMeasuredCsv, type MeasuredData } from '@/lib/import/measured-csv';
import { sectionSchema, type Section } from '@/lib/section/schema';
import { requireWorkspaceMember } from '@/lib/server/access';
import { diffSections, type ShapeChange } from '@/lib/teamwork/section-diff';
import { MaxwellTable } from '@/components/results/maxwell-table';

export const metadata: Metadata = { title: 'Section history' };

type Params = { workspaceId: string; sectionId: string };

const CHANGE_TONE: Record<ShapeChange, 'success' | 'danger' | 'warning' | 'neutral'> = {
  added: 'success',
  removed: 'danger',
  changed: 'warning',
  unchanged: 'neutral',
};

/**
 * A section's history: every revision with author and time, two revisions compared side by
 * side (shapes added, changed, removed; results where both were solved), restoring an old
 * revision as a new one, and the files kept with the section (original drawing, measured data).
 */
export default async function HistoryPage({
  params,
  searchParams,
}: {
  params: Promise<Params>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { workspaceId, sectionId } = await params;
  const sp = await searchParams;
  const { role, workspace } = await requireWorkspaceMember(workspaceId);
  const section = await getSection(workspaceId, sectionId);
  if (!section) notFound();
  const canEdit = role === 'owner' || role === 'editor';
  const revisions = await listRevisions(workspaceId, sectionId);
  const solves = (await listSolves(workspaceId, { sectionId, limit: 500 })).filter((s) => s.status === 'done');
  const solvedBy = new Map<string, (typeof solves)[number]>();
  for (const s of solves) if (!solvedBy.has(s.revisionId)) solvedBy.set(s.revisionId, s); // newest first
  const latest = revisions[0];
  const pick = (v: unknown, fallback: string | undefined) => (typeof v === 'string' && revisions.some((r) => r.id === v) ? v : fallback);
  const bId = pick(sp.b, latest?.id);
  const aId = pick(sp.a, revisions.find((r) => r.id !== bId)?.id ?? bId);
  const [aRev, bRev] = await Promise.all([
    aId ? getRevision(workspaceId, sectionId, aId) : null,
    bId ? getRevision(workspaceId, sectionId, bId) : null,
  ]);
  const parse = (c: unknown): Section | null => {
    const r = sectionSchema.safeParse(c);
    return r.success ? r.data : null;
  };
  const aSec = aRev ? parse(aRev.content) : null;
  const bSec = bRev ? parse(bRev.content) : null;
  const diff = aSec && bSec ? diffSections(aSec, bSec) : null;
  const changes = diff ? Object.fromEntries(diff.shapes.map((s) => [s.id, s.change])) : {};
  const frame = aSec && bSec ? sketchFrame(aSec, bSec) : null;

  const fileList = await listSectionFiles(workspaceId, sectionId);
  const measured: ((typeof fileList)[number] & { data: MeasuredData | null })[] = [];
  for (const f of fileList.filter((x) => x.kind === 'measured-csv')) {
    const row = await getSectionFile(workspaceId, sectionId, f.id);
    try {
      measured.push({ ...f, data: row ? parseMeasuredCsv(new TextDecoder().decode(row.data)) : null });
    } catch {
      measured.push({ ...f, data: null });
    }
  }
  const base = `/w/${workspaceId}/sections/${sectionId}`;

  return (
    <div className="mx-auto w-full max-w-page space-y-5 px-6 py-6">
      <PageHeader
        title="History, files and links"
        eyebrow={
          <Link href={base} className="hover:underline">
            {section.name}
          </Link>
        }
      />

      <Card aria-labelledby="rev-title" data-testid="revisions">
        <CardHeader
          id="rev-title"
          title="Revisions"
          description={`${revisions.length} saved revision${revisions.length === 1 ? '' : 's'}, newest first. Restoring saves an old revision as a new one; nothing is lost.`}
        />
        <table className="w-full table-fixed text-left">
          <thead className="border-b border-line bg-surface-muted text-xs text-ink-muted">
            <tr>
              <th scope="col" className="w-16 px-5 py-2 font-medium">
                Rev.
              </th>
              <th scope="col" className="px-3 py-2 font-medium">
                Message
              </th>
              <th scope="col" className="w-44 px-3 py-2 font-medium">
                Author
              </th>
              <th scope="col" className="w-36 px-3 py-2 font-medium">
                Saved
              </th>
              <th scope="col" className="w-24 px-3 py-2 font-medium">
                Solved
              </th>
              <th scope="col" className="w-56 px-5 py-2">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-line">
            {revisions.map((r) => (
              <tr key={r.id} data-testid="revision-row" data-number={r.number} className={r.id === aId || r.id === bId ? 'bg-copper-50/40' : undefined}>
                <td className="px-5 py-2">
                  <span className="num rounded-sm bg-grey-100 px-1.5 text-xs text-ink-soft">r{r.number}</span>
                </td>
                <td className="truncate px-3 py-2 text-sm text-ink" title={r.message}>
                  {r.message || <span className="text-ink-muted">No message</span>}
                </td>
                <td className="truncate px-3 py-2 text-sm text-ink-soft">{r.author?.name ?? '—'}</td>
                <td className="px-3 py-2 text-sm text-ink-muted">
                  <Time value={r.createdAt} />
                </td>
                <td className="px-3 py-2 text-sm">{solvedBy.has(r.id) ? <Badge tone="success">Solved</Badge> : <span className="text-ink-muted">—</span>}</td>
                <td className="px-5 py-1.5 text-right">
                  {latest && r.id !== latest.id ? (
                    <span className="inline-flex items-center gap-1">
                      <Link href={`${base}/history?a=${r.id}&b=${latest.id}`} className={buttonClass('ghost', 'sm')} data-testid="revision-compare">
                        Compare with latest
                      </Link>
                      {canEdit ? (
                        <RestoreRevisionButton workspaceId={workspaceId} sectionId={sectionId} revisionId={r.id} revisionNumber={r.number} latestRevisionId={latest.id} />
                      ) : null}
                    </span>
                  ) : (
                    <span className="text-xs text-ink-muted">Latest</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Card>

      {revisions.length >= 2 && aRev && bRev && aSec && bSec && diff ? (
        <Card aria-labelledby="cmp-title" data-testid="compare">
          <CardHeader
            id="cmp-title"
            title={`Compare r${aRev.number} with r${bRev.number}`}
            description={
              <span data-testid="compare-summary">
                {diff.counts.added} added, {diff.counts.changed} changed, {diff.counts.removed} removed, {diff.counts.unchanged} unchanged
                {diff.settings.length ? `; also changed: ${diff.settings.join(', ')}` : ''}.
              </span>
            }
            actions={
              <form className="flex items-center gap-2 text-sm" action={`${base}/history`}>
                <label className="sr-only" htmlFor="cmp-a">
                  Older revision
                </label>
                <select id="cmp-a" name="a" defaultValue={aRev.id} className="h-8 rounded-md border border-line-strong bg-surface px-2 text-sm">
                  {revisions.map((r) => (
                    <option key={r.id} value={r.id}>
                      r{r.number}
                    </option>
                  ))}
                </select>
                <span className="text-ink-muted">with</span>
                <label className="sr-only" htmlFor="cmp-b">
                  Newer revision
                </label>
                <select id="cmp-b" name="b" defaultValue={bRev.id} className="h-8 rounded-md border border-line-strong bg-surface px-2 text-sm">
                  {revisions.map((r) => (
                    <option key={r.id} value={r.id}>
                      r{r.number}
                    </option>
                  ))}
                </select>
                <button type="submit" className={buttonClass('secondary', 'sm')}>
                  Compare
                </button>
              </form>
            }
          />
          <div className="grid grid-cols-2 gap-4 px-5 py-4">
            {[
              { rev: aRev, sec: aSec, side: 'a' as const },
              { rev: bRev, sec: bSec, side: 'b' as const },
            ].map(({ rev, sec, side }) => {
              const solve = solvedBy.get(rev.id);
              const result = solve?.result as SectionResult | undefined;
              return (
                <div key={side} className="min-w-0 space-y-3" data-testid={`compare-${side}`}>
                  <p className="text-sm font-medium text-ink">
                    r{rev.number} <span className="font-normal text-ink-muted">· {rev.author?.name ?? 'unknown'} · </span>
                    <Time value={rev.createdAt} className="text-ink-muted" />
                  </p>
                  <SectionSketch
                    section={sec}
                    changes={side === 'b' ? changes : Object.fromEntries(diff.shapes.filter((s) => s.change === 'changed').map((s) => [s.id, 'changed' as const]))}
                    ghosts={side === 'b' ? aSec : undefined}
                    frame={frame}
                    label={`Drawing of revision ${rev.number}`}
                    data-testid={`sketch-${side}`}
                  />
                  {result ? (
                    <div data-testid={`result-${side}`}>
                      <p className="mb-1 text-xs font-medium text-ink-muted">Maxwell capacitance, pF/m (solve of {solve!.createdAt.toISOString().slice(0, 10)})</p>
                      <MaxwellTable nets={result.nets} maxwell={result.capacitance.maxwell} compact />
                      {result.line ? (
                        <p className="mt-1 text-xs text-ink-muted">
                          Z0 {result.line.z0Ohm.toPrecision(4)} Ω · εeff {result.line.epsEff.toPrecision(4)}
                        </p>
                      ) : null}
                    </div>
                  ) : (
                    <p className="text-sm text-ink-muted" data-testid={`result-${side}`}>
                      Not solved yet. Open the section at this revision and solve it to compare results.
                    </p>
                  )}
                </div>
              );
            })}
          </div>
          {diff.shapes.some((s) => s.change !== 'unchanged') ? (
            <ul className="flex flex-wrap gap-2 border-t border-line px-5 py-3" data-testid="compare-changes">
              {diff.shapes
                .filter((s) => s.change !== 'unchanged')
                .map((s) => (
                  <li key={`${s.change}-${s.id}`} data-change={s.change} data-shape={s.id}>
                    <Badge tone={CHANGE_TONE[s.change]}>
                      {s.change} · {s.id}
                      {s.fields.length ? ` (${s.fields.join(', ')})` : ''}
                    </Badge>
                  </li>
                ))}
            </ul>
          ) : null}
          <p className="border-t border-line px-5 py-2 text-xs text-ink-muted">
            Outlines: <span className="font-medium text-green-700">green</span> added, <span className="font-medium text-amber-700">amber</span> changed,{' '}
            <span className="font-medium text-red-700">red dashed</span> removed.
          </p>
        </Card>
      ) : null}

      <ShareLinksPanel workspaceId={workspaceId} targetType="section" targetId={sectionId} canEdit={canEdit} publicAllowed={workspace.allowPublicLinks} />

      <Card aria-labelledby="files-title" data-testid="section-files">
        <CardHeader id="files-title" title="Files" description="The original drawing this section was imported from, and measured data kept for comparison." />
        <div className="grid grid-cols-[1fr_20rem] gap-5 px-5 py-4 max-lg:grid-cols-1">
          <div className="min-w-0">
            {fileList.length === 0 ? (
              <p className="text-sm text-ink-muted">No files yet.</p>
            ) : (
              <ul className="divide-y divide-line rounded-md border border-line">
                {fileList.map((f) => {
                  const m = measured.find((x) => x.id === f.id);
                  return (
                    <li key={f.id} className="flex items-center gap-3 px-3 py-2 text-sm" data-testid="section-file" data-kind={f.kind}>
                      <Badge tone={f.kind === 'measured-csv' ? 'info' : 'accent'}>{f.kind === 'measured-csv' ? 'Measured' : f.kind === 'drawing-svg' ? 'SVG' : 'DXF'}</Badge>
                      <a className="min-w-0 truncate font-medium text-accent hover:underline" href={`/api/workspaces/${workspaceId}/sections/${sectionId}/files/${f.id}`} download={f.name}>
                        {f.name}
                      </a>
                      <span className="ml-auto shrink-0 text-xs text-ink-muted">
                        {m?.data ? `${m.data.x.length} rows · ${m.data.parameter.name} vs ${m.data.series.map((s) => `${s.name} (${s.unit})`).join(', ')} · ` : ''}
                        {(f.bytes / 1024).toFixed(1)} KB · {f.uploadedBy?.name ?? '—'} · <Time value={f.createdAt} />
                      </span>
                    </li>
                  );
                })}
              </ul>
            )}
          </div>
          {canEdit ? <MeasuredUpload workspaceId={workspaceId} sectionId={sectionId} /> : null}
        </div>
      </Card>
    </div>
  );
}
