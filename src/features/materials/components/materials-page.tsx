import { useMemo, useState } from 'react';
import { isFromMemory } from '@shared/model/team-material';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { PageFrame, Panel, tableClass, tdClass, thClass } from '@/components/ui/page-frame';
import { ErrorLine, LoadingLine } from '@/components/ui/spinner';
import { useCan } from '@/features/auth/use-can';
import { useMaterials, type MaterialRow } from '@/features/sketch/api/get-materials';
import { cn } from '@/lib/cn';
import { useDeleteMaterial } from '../api/delete-material';
import { MaterialForm } from './material-form';
import { MaterialsCsvUpload } from './materials-csv-upload';
import { RecheckNote } from './recheck-note';

type Show = 'all' | 'team' | 'library';

/** The team's materials library: built-in rows (read-only) and the team's own, with their sources. */
export function MaterialsPage() {
  const materials = useMaterials();
  const manage = useCan('materials:manage');
  const remove = useDeleteMaterial();
  const [show, setShow] = useState<Show>('all');
  const [confirm, setConfirm] = useState<string | null>(null);
  const rows = useMemo(
    () => (materials.data ?? []).filter((m) => show === 'all' || m.origin === show),
    [materials.data, show],
  );
  const teamCount = (materials.data ?? []).filter((m) => m.origin === 'team').length;

  return (
    <PageFrame
      title="Materials library"
      intro={`${materials.data?.length ?? '…'} materials, ${teamCount} of them the team's own. Team rows take precedence over a built-in row with the same id. Every value needs verifying against its source.`}
    >
      <Panel title="Library">
        <div className="mb-3 flex items-center gap-3">
          <label className="flex items-center gap-2 text-sm text-steel-700">
            Show
            <select
              aria-label="Show materials"
              className={cn(inputClass, 'w-40')}
              value={show}
              onChange={(e) => setShow(e.target.value as Show)}
            >
              <option value="all">All materials</option>
              <option value="team">Team materials</option>
              <option value="library">Built-in materials</option>
            </select>
          </label>
          {remove.isSuccess ? (
            <p role="status" className="text-sm text-emerald-800">
              Deleted {remove.data.deleted}. <RecheckNote result={remove.data} />
            </p>
          ) : null}
          {remove.isError ? <ErrorLine error={remove.error} /> : null}
        </div>
        {materials.isPending ? (
          <LoadingLine />
        ) : materials.isError ? (
          <ErrorLine error={materials.error} />
        ) : null}
        {materials.data ? (
          <table className={tableClass} data-testid="materials">
            <thead>
              <tr>
                <th className={thClass}>Id</th>
                <th className={thClass}>Material</th>
                <th className={thClass}>Origin</th>
                <th className={thClass}>S(T) rows</th>
                <th className={thClass}>Source note</th>
                <th className={thClass}>From memory</th>
                {manage ? (
                  <th className={thClass}>
                    <span className="sr-only">Actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody>
              {rows.map((m) => (
                <MaterialLine
                  key={`${m.origin}-${m.id}`}
                  m={m}
                  manage={manage}
                  confirming={confirm === m.id}
                  onAsk={() => setConfirm(m.id)}
                  onCancel={() => setConfirm(null)}
                  onDelete={() => remove.mutate(m.id, { onSettled: () => setConfirm(null) })}
                  busy={remove.isPending}
                />
              ))}
            </tbody>
          </table>
        ) : null}
      </Panel>
      {manage ? (
        <>
          <Panel title="Add a team material">
            <MaterialForm />
          </Panel>
          <Panel title="Upload a materials CSV">
            <MaterialsCsvUpload />
          </Panel>
        </>
      ) : null}
    </PageFrame>
  );
}

function fromMemoryLabel(m: MaterialRow): string {
  if (!isFromMemory(m)) return 'no';
  const all = m.stress.every((p) => p.fromMemory);
  return all ? 'yes' : 'some rows';
}

function MaterialLine(props: {
  readonly m: MaterialRow;
  readonly manage: boolean;
  readonly confirming: boolean;
  readonly busy: boolean;
  readonly onAsk: () => void;
  readonly onCancel: () => void;
  readonly onDelete: () => void;
}) {
  const { m } = props;
  const temps = m.stress.map((p) => p.tempF);
  const memory = fromMemoryLabel(m);
  return (
    <tr data-material={m.id} data-origin={m.origin}>
      <td className={cn(tdClass, 'font-mono text-xs')}>{m.id}</td>
      <td className={tdClass}>
        {m.name}
        <span className="block text-xs text-steel-500">
          {m.spec} {m.grade}
        </span>
      </td>
      <td className={tdClass}>
        <span
          className={cn(
            'whitespace-nowrap rounded px-1.5 py-px text-xs font-medium',
            m.origin === 'team'
              ? 'bg-copper-400/20 text-copper-600'
              : 'bg-steel-100 text-steel-600',
          )}
        >
          {m.origin === 'team' ? 'Team' : 'Built-in'}
        </span>
      </td>
      <td className={cn(tdClass, 'whitespace-nowrap tabular-nums')}>
        {temps.length} · {Math.min(...temps)}–{Math.max(...temps)} °F
      </td>
      <td className={cn(tdClass, 'max-w-md text-xs text-steel-700')}>
        {m.origin === 'team' ? m.sourceNote || m.source : m.source}
      </td>
      <td
        className={cn(tdClass, memory !== 'no' && 'font-medium text-amber-800')}
        data-from-memory={memory}
      >
        {memory}
      </td>
      {props.manage ? (
        <td className={cn(tdClass, 'whitespace-nowrap text-right')}>
          {m.origin !== 'team' ? (
            <span className="text-xs text-steel-400">read-only</span>
          ) : props.confirming ? (
            <span className="inline-flex items-center gap-2">
              <span className="text-xs">Delete {m.id}?</span>
              <Button size="sm" variant="danger" disabled={props.busy} onClick={props.onDelete}>
                Confirm delete
              </Button>
              <Button size="sm" variant="ghost" onClick={props.onCancel}>
                Cancel
              </Button>
            </span>
          ) : (
            <Button size="sm" variant="danger" aria-label={`Delete ${m.id}`} onClick={props.onAsk}>
              Delete
            </Button>
          )}
        </td>
      ) : null}
    </tr>
  );
}
