'use client';
/** Copies text (a table as tab-separated values) to the clipboard and says so. */
import { useState } from 'react';
import { Check, Copy } from 'lucide-react';
import { Button } from '@/components/ui/button';

export function CopyButton({ text, label = 'Copy', testId }: { text: () => string; label?: string; testId?: string }) {
  const [state, setState] = useState<'idle' | 'copied' | 'failed'>('idle');
  const copy = async () => {
    const value = text();
    try {
      await navigator.clipboard.writeText(value);
      setState('copied');
    } catch {
      // clipboard refused (insecure context): fall back to a hidden textarea
      try {
        const ta = document.createElement('textarea');
        ta.value = value;
        ta.style.position = 'fixed';
        ta.style.opacity = '0';
        document.body.appendChild(ta);
        ta.select();
        const ok = document.execCommand('copy');
        ta.remove();
        setState(ok ? 'copied' : 'failed');
      } catch {
        setState('failed');
      }
    }
    window.setTimeout(() => setState('idle'), 1800);
  };
  return (
    <Button size="sm" variant="ghost" onClick={copy} data-testid={testId} data-copy-text={undefined} aria-live="polite">
      {state === 'copied' ? <Check className="size-3.5" aria-hidden /> : <Copy className="size-3.5" aria-hidden />}
      {state === 'copied' ? 'Copied' : state === 'failed' ? 'Copy failed' : label}
    </Button>
  );
}
