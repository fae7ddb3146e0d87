/** The product's caution beside any field-strength value (product rule 4). */
import { cn } from '@/components/ui/cn';

export const FIELD_CAUTION =
  'A 2D quasi-static model. Sharp corners are singular, so peak values depend on the mesh. ' +
  'Not a substitute for clearance, creepage and insulation standards (such as IEC 60664-1), local codes or licensed practice.';

export function FieldCaution({ className, compact, testId = 'field-caution' }: { className?: string; compact?: boolean; testId?: string }) {
  return (
    <p
      role="note"
      data-testid={testId}
      className={cn('rounded-md border border-amber-100 bg-amber-50 text-amber-700', compact ? 'px-2 py-1 text-xs' : 'px-3 py-2 text-sm', className)}
    >
      <span className="font-semibold">Caution: </span>
      {FIELD_CAUTION}
    </p>
  );
}
