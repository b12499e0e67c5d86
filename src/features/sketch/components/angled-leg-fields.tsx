import { useMemo, useState } from 'react';
import { DIRECTIONS, type Direction, type Heading } from '@shared/model/spool';
import { Button } from '@/components/ui/button';
import { inputClass } from '@/components/ui/field';
import { cn } from '@/lib/cn';
import { angledDirection, type AngledField, type AngledIssue } from '../geometry/angled-direction';
import { buildSpoolPath } from '../geometry/spool-path';
import { angleBetweenDeg } from '../geometry/vec';
import { useSpoolStore } from '../store/spool-store-context';

export const ANGLED_FIELD_LABELS: Record<AngledField, string> = {
  from: 'From',
  toward: 'Toward',
  angle: 'Angle',
  rollToward: 'Roll toward',
  roll: 'Roll',
};

const NAMES: Record<Direction, string> = {
  north: 'North',
  south: 'South',
  east: 'East',
  west: 'West',
  up: 'Up',
  down: 'Down',
};

const parseNumber = (text: string): number => {
  const t = text.trim().replace(',', '.');
  return t === '' ? Number.NaN : Number(t);
};

export interface AngledLegFieldsProps {
  /** Draw a leg along the heading; `description` reads like "45° from east toward north". */
  readonly onDraw: (heading: Heading, description: string) => void;
  /** Report field problems (field-named) when a draw is asked with bad values. */
  readonly onInvalid: (text: string) => void;
}

/**
 * A leg off the six axes: from one axis toward a perpendicular one by an angle, optionally
 * rolled toward a third axis (a rolled offset). Shows the bend the leg makes at the run's end.
 */
export function AngledLegFields({ onDraw, onInvalid }: AngledLegFieldsProps) {
  const [from, setFrom] = useState<Direction>('east');
  const [toward, setToward] = useState<Direction>('north');
  const [angleText, setAngleText] = useState('45');
  const [rollToward, setRollToward] = useState<Direction | ''>('');
  const [rollText, setRollText] = useState('0');
  const [touched, setTouched] = useState(false);
  const doc = useSpoolStore((s) => s.doc);
  const endDir = useMemo(
    () => (doc.elements.length > 0 ? buildSpoolPath(doc).endDir : undefined),
    [doc],
  );

  const result = angledDirection({
    from,
    toward,
    angle: parseNumber(angleText),
    roll: rollText.trim() === '' ? 0 : parseNumber(rollText),
    ...(rollToward ? { rollToward } : {}),
  });
  const issues: readonly AngledIssue[] = result.ok ? [] : result.issues;
  const errorOf = (f: AngledField) => {
    const iss = issues.find((i) => i.field === f);
    return iss && touched ? `${ANGLED_FIELD_LABELS[f]} ${iss.message}` : undefined;
  };
  const turn = result.ok && endDir ? angleBetweenDeg(endDir, result.dir) : undefined;

  const draw = () => {
    setTouched(true);
    if (!result.ok) {
      onInvalid(
        result.issues.map((i) => `${ANGLED_FIELD_LABELS[i.field]} ${i.message}`).join('; '),
      );
      return;
    }
    onDraw(result.heading, result.description);
  };

  const select = (
    label: string,
    value: string,
    onChange: (v: string) => void,
    field: AngledField,
    withNone = false,
  ) => {
    const err = errorOf(field);
    return (
      <label className="flex flex-col text-[11px] text-steel-500">
        {label}
        <select
          aria-label={`Angled leg ${label.toLowerCase()}`}
          aria-invalid={err ? true : undefined}
          className={cn(inputClass, 'w-20')}
          value={value}
          onChange={(e) => {
            onChange(e.target.value);
            setTouched(true);
          }}
        >
          {withNone ? <option value="">—</option> : null}
          {DIRECTIONS.map((d) => (
            <option key={d} value={d}>
              {NAMES[d]}
            </option>
          ))}
        </select>
      </label>
    );
  };
  const number = (
    label: string,
    value: string,
    onChange: (v: string) => void,
    field: AngledField,
  ) => (
    <label className="flex flex-col text-[11px] text-steel-500">
      {label} (°)
      <input
        aria-label={`Angled leg ${label.toLowerCase()}`}
        aria-invalid={errorOf(field) ? true : undefined}
        inputMode="decimal"
        className={cn(inputClass, 'w-16')}
        value={value}
        onChange={(e) => {
          onChange(e.target.value);
          setTouched(true);
        }}
        onKeyDown={(e) => {
          if (e.key === 'Enter') draw();
        }}
      />
    </label>
  );
  const errors = (['from', 'toward', 'angle', 'rollToward', 'roll'] as const)
    .map(errorOf)
    .filter(Boolean);

  return (
    <div
      className="flex flex-col gap-1 border-t border-steel-100 px-3 py-2"
      role="group"
      aria-label="Angled leg"
      data-testid="angled-leg"
    >
      <div className="flex flex-wrap items-end gap-2">
        <span className="self-center text-xs font-semibold text-steel-600">Angled leg</span>
        {select('From', from, (v) => setFrom(v as Direction), 'from')}
        {select('Toward', toward, (v) => setToward(v as Direction), 'toward')}
        {number('Angle', angleText, setAngleText, 'angle')}
        {select(
          'Roll toward',
          rollToward,
          (v) => setRollToward(v as Direction | ''),
          'rollToward',
          true,
        )}
        {number('Roll', rollText, setRollText, 'roll')}
        <Button
          onClick={draw}
          title="Draw a leg of the leg length in this direction (after the selected element when “after selected” is ticked)"
        >
          Draw angled leg
        </Button>
        <span className="self-center text-xs text-steel-600" data-testid="angled-preview">
          {result.ok
            ? `${result.description}${turn !== undefined ? ` · bend at the run's end ${Math.round(turn * 100) / 100}°` : ''}`
            : null}
        </span>
      </div>
      {errors.length > 0 ? (
        <ul role="alert" className="text-xs text-red-700" data-testid="angled-errors">
          {errors.map((e) => (
            <li key={e}>{e}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
