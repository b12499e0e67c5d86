import { CAUTION } from '@shared/model/caution';
import { cn } from '@/lib/cn';

/** The engineering caution, shown wherever check results appear. */
export function CautionNote({ className }: { readonly className?: string }) {
  return (
    <p
      role="note"
      data-testid="caution"
      className={cn(
        'rounded border-l-4 border-copper-500 bg-copper-400/10 px-2 py-1 text-xs text-steel-700',
        className,
      )}
    >
      <strong className="font-semibold text-copper-600">Caution. </strong>
      {CAUTION}
    </p>
  );
}
