import type { Metadata } from 'next';
import Link from 'next/link';
import { Logo } from '@/components/app-shell/logo';
import { Alert } from '@/components/ui/alert';
import { Card, CardHeader } from '@/components/ui/card';
import { SectionSketch } from '@/components/teamwork/section-sketch';
import type { SectionResult } from '@/lib/engine/types';
import { resolveSection } from '@/lib/section/resolve';
import { sectionSchema, type Section } from '@/lib/section/schema';
import { getSessionUser } from '@/lib/server/session';
import { openShareLink } from '@/lib/server/share';
import { MaxwellTable, formatPf } from '@/components/results/maxwell-table';

export const metadata: Metadata = { title: 'Shared from Edgefield', robots: { index: false, follow: false } };
export const dynamic = 'force-dynamic';

/** A read-only view of a shared section or solve (no editing, no comments). */
export default async function SharedPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const user = await getSessionUser();
  const open = await openShareLink(token, user);
  return (
    <div className="min-h-screen bg-canvas">
      <header className="flex h-12 items-center gap-3 border-b border-line bg-surface px-5">
        <Link href="/" aria-label="Edgefield home">
          <Logo />
        </Link>
        <span className="text-sm text-ink-muted">Read-only link</span>
        {!user ? (
          <Link href={`/login?callbackUrl=${encodeURIComponent(`/s/${token}`)}`} className="ml-auto text-sm font-medium text-accent hover:underline">
            Sign in
          </Link>
        ) : null}
      </header>
      <main id="main" className="mx-auto w-full max-w-page space-y-4 px-6 py-6" data-testid="shared-page" data-status={open.status}>
        {open.status === 'not_found' ? (
          <Alert tone="danger" title="This link does not work" data-testid="shared-error">
            The link is not valid, or what it pointed to was deleted.
          </Alert>
        ) : open.status === 'revoked' ? (
          <Alert tone="danger" title="This link was revoked" data-testid="shared-error">
            Someone in {open.workspaceName} turned this link off. Ask them for a new one.
          </Alert>
        ) : open.status === 'expired' ? (
          <Alert tone="danger" title="This link has expired" data-testid="shared-error">
            Ask someone in {open.workspaceName} for a new link.
          </Alert>
        ) : open.status === 'members_only' ? (
          <Alert tone="warning" title="Members only" data-testid="shared-error">
            {open.workspaceName} does not allow public links. Sign in as a member of the workspace to open it.
          </Alert>
        ) : open.status === 'ok' ? (
          <SharedBody open={open} />
        ) : null}
      </main>
    </div>
  );
}

function SharedBody({ open }: { open: Extract<Awaited<ReturnType<typeof openShareLink>>, { status: 'ok' }> }) {
  const t = open.target;
  const parsed = sectionSchema.safeParse(t.content);
  const title = t.type === 'section' ? t.name : `Solve of ${t.sectionName}`;
  const result = t.type === 'solve' ? (t.result as SectionResult | null) : null;
  return (
    <>
      <div>
        <p className="text-sm text-ink-muted">{open.workspaceName}</p>
        <h1 className="text-2xl font-semibold text-ink" data-testid="shared-title">
          {title}
        </h1>
        {t.type === 'section' && t.description ? <p className="mt-1 max-w-prose text-sm text-ink-soft">{t.description}</p> : null}
        <p className="text-sm text-ink-muted">
          {t.type === 'section' ? `Revision r${t.revisionNumber ?? '—'}` : `Revision r${t.revisionNumber}, solved ${t.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC${t.author ? ` by ${t.author}` : ''}`}
        </p>
      </div>
      <Card>
        <CardHeader title="Cross-section" description={parsed.success ? `${parsed.data.shapes.length} shapes, units ${parsed.data.units}` : undefined} />
        <div className="p-4">
          {parsed.success ? (
            <>
              <SectionSketch section={parsed.data} label={`Drawing of ${title}`} data-testid="shared-sketch" />
              <SketchKey section={parsed.data} />
            </>
          ) : (
            <p className="text-sm text-ink-muted">No drawing.</p>
          )}
        </div>
      </Card>
      {result ? (
        <Card data-testid="shared-result">
          <CardHeader title="Maxwell capacitance matrix" description="Per unit length, pF/m, reference: ground nets and grounded boundaries." />
          <div className="overflow-x-auto p-4">
            <MaxwellTable nets={result.nets} maxwell={result.capacitance.maxwell} />
            {result.line ? (
              <p className="mt-3 text-sm text-ink-soft">
                Z0 {result.line.z0Ohm.toPrecision(4)} Ω · εeff {result.line.epsEff.toPrecision(4)} · C′ {formatPf(result.line.capacitancePerM)} pF/m
              </p>
            ) : null}
            <p className="mt-2 text-xs text-ink-muted">
              Estimated relative error {(result.errorEstimate.relative * 100).toPrecision(2)} %. A 2D quasi-static model of the drawn cross-section; sharp corners are
              singular, so any peak field depends on the mesh. Not a substitute for clearance, creepage or insulation standards (e.g. IEC 60664-1), local codes or
              licensed practice.
            </p>
          </div>
        </Card>
      ) : null}
    </>
  );
}

/** The colours SectionSketch fills with (components/teamwork/section-sketch.tsx). */
const KEY_COLOURS = { signal: '#d5773b', ground: '#68767b', dielectric: '#d9e7f0' } as const;

function Swatch({ colour }: { colour: string }) {
  return <span aria-hidden className="inline-block size-3 shrink-0 rounded-sm border border-line-strong" style={{ background: colour }} />;
}

/** What the sketch's colours mean, and the named dimensions and materials, read-only. */
function SketchKey({ section }: { section: Section }) {
  const r = resolveSection(section);
  const resolved = r.ok ? r.section : r.partial;
  const unit = section.units === 'um' ? 'µm' : section.units;
  const vars = Object.entries(resolved.variables ?? {});
  const num = (v: number) => String(Number(v.toPrecision(6)));
  return (
    <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm" data-testid="shared-key">
      <dt className="text-ink-muted">Nets</dt>
      <dd className="flex flex-wrap gap-x-4 gap-y-1">
        {resolved.nets.map((n) => (
          <span key={n.name} className="inline-flex items-center gap-1.5">
            <Swatch colour={n.role === 'ground' ? KEY_COLOURS.ground : KEY_COLOURS.signal} />
            <span className="font-medium text-ink">{n.name}</span>
            <span className="text-ink-muted">{n.role}</span>
          </span>
        ))}
      </dd>
      {resolved.materials.length ? (
        <>
          <dt className="text-ink-muted">Dielectrics</dt>
          <dd className="flex flex-wrap gap-x-4 gap-y-1">
            {resolved.materials.map((m) => (
              <span key={m.id} className="inline-flex items-center gap-1.5">
                <Swatch colour={KEY_COLOURS.dielectric} />
                <span className="font-medium text-ink">{m.name}</span>
                <span className="text-ink-muted tabular-nums">εr {num(m.epsR)}</span>
              </span>
            ))}
          </dd>
        </>
      ) : null}
      {vars.length ? (
        <>
          <dt className="text-ink-muted">Dimensions</dt>
          <dd className="flex flex-wrap gap-x-4 gap-y-1 tabular-nums text-ink">
            {vars.map(([k, v]) => (
              <span key={k}>
                {k} = {num(v)} {unit}
              </span>
            ))}
          </dd>
        </>
      ) : null}
    </dl>
  );
}
