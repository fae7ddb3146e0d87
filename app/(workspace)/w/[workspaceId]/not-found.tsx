import { SearchX } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';

export default function WorkspaceNotFound() {
  return (
    <div className="mx-auto w-full max-w-page px-6 py-16" data-testid="not-found">
      <EmptyState icon={SearchX} title="Not found" action={<ButtonLink href="/">Go to your workspace</ButtonLink>}>
        There is nothing here, or you are not a member of the workspace it belongs to.
      </EmptyState>
    </div>
  );
}
