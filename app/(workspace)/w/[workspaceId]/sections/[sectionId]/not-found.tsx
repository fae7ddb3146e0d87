import { FileQuestion } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';

export default function SectionNotFound() {
  return (
    <div className="mx-auto w-full max-w-page px-6 py-16" data-testid="not-found">
      <EmptyState icon={FileQuestion} title="Section not found" action={<ButtonLink href="/">Back to your workspace</ButtonLink>}>
        It does not exist in this workspace. It may have been moved, or the link is wrong.
      </EmptyState>
    </div>
  );
}
