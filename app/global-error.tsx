'use client';

/** Last resort when the root layout itself fails: plain HTML, no app styles needed. */
export default function GlobalError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en">
      <body style={{ fontFamily: 'system-ui, sans-serif', background: '#f4f6f5', color: '#141d23', margin: 0 }}>
        <main style={{ maxWidth: 520, margin: '15vh auto', padding: 24 }}>
          <h1 style={{ fontSize: 22 }}>Edgefield could not be shown</h1>
          <p style={{ color: '#5a676d' }}>
            Something went wrong while loading the app. Your saved work is not affected. Try again, or reload the page.
          </p>
          {error.digest ? <p style={{ fontFamily: 'monospace', fontSize: 12, color: '#5a676d' }}>Reference: {error.digest}</p> : null}
          <button
            type="button"
            onClick={reset}
            style={{ background: '#a44f19', color: 'white', border: 0, borderRadius: 6, padding: '8px 14px', fontSize: 14 }}
          >
            Try again
          </button>
        </main>
      </body>
    </html>
  );
}
