import { useEffect, useRef, useState } from 'react';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { cn } from '@/lib/cn';

export interface ReturnFormProps {
  readonly onReturn: (note: string) => void;
  readonly onCancel: () => void;
  readonly busy?: boolean;
}

/** Asks in the page why a spool goes back to its designer; the note becomes a comment of the revision. */
export function ReturnForm({ onReturn, onCancel, busy }: ReturnFormProps) {
  const [note, setNote] = useState('');
  const [error, setError] = useState<string | null>(null);
  const box = useRef<HTMLTextAreaElement>(null);
  useEffect(() => box.current?.focus(), []);
  return (
    <form
      role="dialog"
      aria-label="Return to designer"
      noValidate
      className="flex w-full flex-col gap-2 rounded border border-amber-300 bg-amber-50 p-3 text-sm"
      onSubmit={(e) => {
        e.preventDefault();
        if (note.trim() === '') {
          setError(
            'Note: say what the designer should change (it is sent to them and kept as a comment)',
          );
          return;
        }
        setError(null);
        onReturn(note.trim());
      }}
      onKeyDown={(e) => {
        if (e.key === 'Escape') onCancel();
      }}
    >
      <label htmlFor="return-note" className="font-semibold text-amber-950">
        Why is it returned? The note goes to the designer and stays as a comment on this revision.
      </label>
      <textarea
        id="return-note"
        ref={box}
        rows={3}
        maxLength={2000}
        aria-invalid={error ? true : undefined}
        className={cn(inputClass, 'h-auto py-1', error && 'border-red-400')}
        value={note}
        onChange={(e) => setNote(e.target.value)}
      />
      {error ? (
        <p role="alert" className="text-xs text-red-700">
          {error}
        </p>
      ) : null}
      <div className="flex gap-2">
        <Button type="submit" size="sm" variant="primary" disabled={busy}>
          {busy ? 'Returning…' : 'Return with this note'}
        </Button>
        <Button size="sm" variant="ghost" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
