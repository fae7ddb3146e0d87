import Link from 'next/link';

export default function SolveNotFound() {
  return (
    <div className="mx-auto w-full max-w-page px-6 py-12 text-center">
      <h1 className="text-xl font-semibold text-ink">Solve not found</h1>
      <p className="mt-2 text-sm text-ink-muted">It may have been removed, or the link belongs to a workspace you are not a member of.</p>
      <Link href="/" className="mt-4 inline-block text-sm font-medium text-accent hover:underline">
        Back to your workspace
      </Link>
    </div>
  );
}
