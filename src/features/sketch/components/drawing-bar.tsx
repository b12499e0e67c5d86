import { useEffect, useMemo, useRef, useState } from 'react';
import { listPipeWalls, normalizeNps, NPS_SIZES, SCHEDULES } from '@shared/data/pipe-dimensions';
import type { Direction, Heading } from '@shared/model/spool';
import { convert } from '@shared/units/units';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import { FALLBACK_BEND_RADIUS } from '../geometry/pipe-size';
import { useSpoolStore, useSpoolStoreApi } from '../store/spool-store-context';
import { AngledLegFields } from './angled-leg-fields';
import { useDisplayUnits } from './display-units';
import { DIRECTION_KEYS, useSketchKeys } from './sketch-keys';

const DIRECTION_LABELS: Record<Direction, string> = {
  north: 'North',
  south: 'South',
  east: 'East',
  west: 'West',
  up: 'Up',
  down: 'Down',
};

export interface Notice {
  readonly tone: 'refused' | 'info';
  readonly text: string;
}

export interface DrawingBarProps {
  /** False for members who may not edit: only view keys (fit, help, Esc) stay. */
  readonly canEdit: boolean;
  readonly onSave?: () => void;
}

/**
 * The drawing bar: pipe size of the run, leg length, the six direction buttons, angled legs
 * (plane + angle, optional roll), undo/redo, delete and insert-after. Refused edits are
 * reported under the bar.
 */
export function DrawingBar({ canEdit, onSave }: DrawingBarProps) {
  const api = useSpoolStoreApi();
  const units = useDisplayUnits();
  const drawingPipe = useSpoolStore((s) => s.drawingPipe);
  const selectedId = useSpoolStore((s) => s.selectedId);
  const canUndo = useSpoolStore((s) => s.canUndo);
  const canRedo = useSpoolStore((s) => s.canRedo);
  const defaultRadius = useSpoolStore((s) => s.doc.defaultBendRadius);
  const radiusChoice =
    defaultRadius && typeof defaultRadius === 'object'
      ? String(defaultRadius.multipleOfD)
      : defaultRadius === undefined
        ? ''
        : 'length';

  const [lengthText, setLengthText] = useState(() => (units.display === 'metric' ? '1000' : '36'));
  const [insertAfter, setInsertAfter] = useState(false);
  const [angledOpen, setAngledOpen] = useState(false);
  const [notice, setNotice] = useState<Notice | null>(null);
  const lastUnits = useRef(units.display);
  // Switching display units converts the length being typed, so the same leg is drawn.
  useEffect(() => {
    if (lastUnits.current === units.display) return;
    const v = Number(lengthText);
    if (Number.isFinite(v) && v > 0) {
      const converted = convert(v, 'length', lastUnits.current, units.display);
      setLengthText(String(Number(converted.toPrecision(5))));
    }
    lastUnits.current = units.display;
  }, [units, lengthText]);

  const nps = normalizeNps(drawingPipe.nps) ?? String(drawingPipe.nps);
  const schedules = useMemo(() => {
    const listed = listPipeWalls(nps).map((w) => w.schedule);
    const list = listed.length > 0 ? listed : [...SCHEDULES];
    return list.includes(drawingPipe.schedule) ? list : [drawingPipe.schedule, ...list];
  }, [nps, drawingPipe.schedule]);

  const lengthValue = Number(lengthText.replace(',', '.'));
  const lengthOk = lengthText.trim() !== '' && Number.isFinite(lengthValue) && lengthValue > 0;
  const lengthError = lengthOk ? undefined : 'Leg length must be a number greater than zero';

  const report = (r: { ok: true } | { ok: false; message: string }, done?: string) => {
    if (r.ok) setNotice(done ? { tone: 'info', text: done } : null);
    else setNotice({ tone: 'refused', text: r.message });
  };

  const drawLeg = (direction: Direction | Heading, after: boolean, done?: string) => {
    if (!canEdit) return;
    if (!lengthOk) {
      setNotice({ tone: 'refused', text: lengthError! });
      return;
    }
    const length = units.fromDisplay(lengthValue, 'length');
    const s = api.getState();
    const target = after ? s.selectedId : null;
    if (after && !target) {
      setNotice({
        tone: 'refused',
        text: 'select an element first: the new leg goes right after it',
      });
      return;
    }
    const r = target ? s.insertLegAfter(target, direction, length) : s.addLeg(direction, length);
    report(r, done);
  };

  const deleteSelected = () => {
    const s = api.getState();
    if (!canEdit || !s.selectedId) return;
    report(s.deleteElement(s.selectedId), `deleted ${s.selectedId}`);
  };

  const startRun = () => {
    const s = api.getState();
    if (
      s.doc.elements.length > 0 &&
      !window.confirm('Start a new run? This removes every element (you can undo it).')
    )
      return;
    report(
      s.startRun({ nps: drawingPipe.nps, schedule: drawingPipe.schedule }),
      `new run: NPS ${nps}, schedule ${drawingPipe.schedule}`,
    );
  };

  useSketchKeys({
    onDirection: canEdit ? (d, shift) => drawLeg(d, shift || insertAfter) : undefined,
    onUndo: canEdit ? () => api.getState().undo() : undefined,
    onRedo: canEdit ? () => api.getState().redo() : undefined,
    onDelete: canEdit ? deleteSelected : undefined,
    onEscape: () => api.getState().select(null),
    onSave,
  });

  return (
    <div className="border-b border-steel-200 bg-white">
      <div className="flex flex-wrap items-end gap-2 px-3 py-2" role="toolbar" aria-label="Drawing">
        {canEdit ? (
          <>
            <div className="flex items-end gap-1.5">
              <label className="flex flex-col text-[11px] text-steel-500">
                NPS
                <select
                  aria-label="Run NPS"
                  className={cn(inputClass, 'w-20')}
                  value={nps}
                  onChange={(e) => {
                    const next = e.target.value;
                    const walls = listPipeWalls(next).map((w) => w.schedule);
                    const schedule = walls.includes(drawingPipe.schedule)
                      ? drawingPipe.schedule
                      : (walls.find((w) => w === '40' || w === 'STD') ??
                        walls[0] ??
                        drawingPipe.schedule);
                    api.getState().setDrawingPipe({ nps: next, schedule });
                  }}
                >
                  {NPS_SIZES.map((n) => (
                    <option key={n} value={n}>
                      {n}
                    </option>
                  ))}
                </select>
              </label>
              <label className="flex flex-col text-[11px] text-steel-500">
                Schedule
                <select
                  aria-label="Run schedule"
                  className={cn(inputClass, 'w-20')}
                  value={drawingPipe.schedule}
                  onChange={(e) =>
                    api
                      .getState()
                      .setDrawingPipe({ nps: drawingPipe.nps, schedule: e.target.value })
                  }
                >
                  {schedules.map((s) => (
                    <option key={s} value={s}>
                      {s}
                    </option>
                  ))}
                </select>
              </label>
              <Button onClick={startRun} title="Clear the sketch and start a run with this pipe">
                Start run
              </Button>
            </div>
            <label
              className="flex flex-col text-[11px] text-steel-500"
              title="Bend radius given to bends drawn from now on (existing bends keep theirs)"
            >
              New bends
              <select
                aria-label="Radius of new bends"
                className={cn(inputClass, 'w-24')}
                value={radiusChoice}
                onChange={(e) => {
                  const v = Number(e.target.value);
                  if (Number.isFinite(v) && v > 0)
                    report(api.getState().setDefaultBendRadius({ multipleOfD: v }));
                }}
              >
                {radiusChoice === '' ? (
                  <option value="">
                    {typeof FALLBACK_BEND_RADIUS === 'object'
                      ? `${FALLBACK_BEND_RADIUS.multipleOfD} × D`
                      : 'standard'}{' '}
                    (default)
                  </option>
                ) : null}
                {radiusChoice === 'length' ? <option value="length">as set</option> : null}
                {['1', '1.5', '2', '3', '5'].map((m) => (
                  <option key={m} value={m}>
                    {m} × D
                  </option>
                ))}
                {radiusChoice !== '' &&
                radiusChoice !== 'length' &&
                !['1', '1.5', '2', '3', '5'].includes(radiusChoice) ? (
                  <option value={radiusChoice}>{radiusChoice} × D</option>
                ) : null}
              </select>
            </label>
            <div className="h-8 w-px bg-steel-200" />
            <label className="flex flex-col text-[11px] text-steel-500">
              Leg length ({units.label('length')})
              <input
                aria-label="Leg length"
                aria-invalid={lengthOk ? undefined : true}
                inputMode="decimal"
                className={cn(inputClass, 'w-24')}
                value={lengthText}
                onChange={(e) => setLengthText(e.target.value)}
                onKeyDown={(e) => {
                  if (e.key === 'Enter') (e.target as HTMLInputElement).blur();
                }}
              />
            </label>
            <div className="flex gap-1" role="group" aria-label="Draw a leg">
              {DIRECTION_KEYS.map((d) => (
                <Button
                  key={d.direction}
                  data-direction={d.direction}
                  aria-label={`Draw leg ${DIRECTION_LABELS[d.direction]} ${d.label}`}
                  title={`${DIRECTION_LABELS[d.direction]} (${d.label}; Shift: after selected)`}
                  onClick={(e) => drawLeg(d.direction, e.shiftKey || insertAfter)}
                  className="w-12 flex-col gap-0 px-1 leading-tight"
                >
                  <span>{DIRECTION_LABELS[d.direction]}</span>{' '}
                  <span className="text-[10px] text-steel-400">{d.label}</span>
                </Button>
              ))}
            </div>
            <Button
              aria-expanded={angledOpen}
              onClick={() => setAngledOpen((o) => !o)}
              title="Draw a leg at any angle: from an axis toward another, optionally rolled"
            >
              Angled…
            </Button>
            <label
              className="flex items-center gap-1 text-xs text-steel-600"
              title="Direction buttons insert the leg after the selected element instead of at the run's end"
            >
              <input
                type="checkbox"
                checked={insertAfter}
                onChange={(e) => setInsertAfter(e.target.checked)}
                disabled={!selectedId && !insertAfter}
              />
              after selected
            </label>
            <div className="h-8 w-px bg-steel-200" />
            <div className="flex gap-1">
              <Button
                onClick={() => api.getState().undo()}
                disabled={!canUndo}
                title="Undo (Ctrl+Z)"
              >
                ↶ Undo
              </Button>
              <Button
                onClick={() => api.getState().redo()}
                disabled={!canRedo}
                title="Redo (Ctrl+Shift+Z)"
              >
                ↷ Redo
              </Button>
              <Button
                variant="danger"
                onClick={deleteSelected}
                disabled={!selectedId}
                title="Delete the selected element (Delete)"
              >
                Delete
              </Button>
            </div>
          </>
        ) : (
          <p className="text-sm text-steel-600" data-testid="view-only">
            View only: your role can read this spool and its checks but not change it.
          </p>
        )}
      </div>
      {canEdit && angledOpen ? (
        <AngledLegFields
          onDraw={(heading, description) => drawLeg(heading, insertAfter, `leg ${description}`)}
          onInvalid={(text) => setNotice({ tone: 'refused', text })}
        />
      ) : null}
      {notice ? (
        <div
          role={notice.tone === 'refused' ? 'alert' : 'status'}
          data-testid="edit-notice"
          className={cn(
            'flex items-center gap-2 border-t px-3 py-1 text-sm',
            notice.tone === 'refused'
              ? 'border-red-200 bg-red-50 text-red-800'
              : 'border-steel-100 bg-steel-50 text-steel-700',
          )}
        >
          <strong>{notice.tone === 'refused' ? 'Not drawn:' : 'Done:'}</strong> {notice.text}
          <button
            type="button"
            className="ml-auto text-xs underline"
            onClick={() => setNotice(null)}
          >
            dismiss
          </button>
        </div>
      ) : null}
    </div>
  );
}
