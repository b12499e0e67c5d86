import { useEffect, useState } from 'react';
import { DEFAULT_TEST_TEMPERATURE, type ShopSettings, type UnitSystem } from '@shared/model/spool';
import { convert } from '@shared/units/units';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { parseNumberInput } from './condition-fields';
import { roundForEntry, useDisplayUnits } from './display-units';

type Texts = { testTemperature: string; bendTangent: string };
type Errors = Partial<Record<keyof Texts, string>>;

const LABELS: Record<keyof Texts, string> = {
  testTemperature: 'Hydrotest temperature',
  bendTangent: 'Bending tangent',
};

export interface ShopSettingsFormProps {
  readonly settings: ShopSettings | undefined;
  readonly docUnits: UnitSystem;
  readonly onApply: (next: {
    testTemperature: number | undefined;
    bendTangent: number | undefined;
  }) => string | null;
  readonly readOnly?: boolean;
}

/** Shop settings of the spool (fabrication sheet): hydrotest temperature and the straight added at bend ends for the bending machine. */
export function ShopSettingsForm({ settings, docUnits, onApply, readOnly }: ShopSettingsFormProps) {
  const units = useDisplayUnits();
  const toTexts = (): Texts => ({
    testTemperature:
      settings?.testTemperature === undefined
        ? ''
        : String(roundForEntry(units.toDisplay(settings.testTemperature, 'temperature'))),
    bendTangent:
      settings?.bendTangent === undefined
        ? ''
        : String(roundForEntry(units.toDisplay(settings.bendTangent, 'length'))),
  });
  const [texts, setTexts] = useState<Texts>(toTexts);
  const [errors, setErrors] = useState<Errors>({});
  const [refusal, setRefusal] = useState<string | null>(null);
  // A new document (undo, reload) or a units switch refreshes the fields.
  // eslint-disable-next-line react-hooks/exhaustive-deps -- follow the stored values and units only
  useEffect(() => setTexts(toTexts()), [settings?.testTemperature, settings?.bendTangent, units]);
  const stored = toTexts();
  const dirty =
    texts.testTemperature !== stored.testTemperature || texts.bendTangent !== stored.bendTangent;
  const defaultTemp = roundForEntry(
    convert(DEFAULT_TEST_TEMPERATURE[docUnits], 'temperature', docUnits, units.display),
  );

  const apply = () => {
    const next: Errors = {};
    const t = parseNumberInput(texts.testTemperature);
    const g = parseNumberInput(texts.bendTangent);
    if (t !== undefined && !Number.isFinite(t))
      next.testTemperature = `${LABELS.testTemperature} must be a number`;
    if (g !== undefined && !Number.isFinite(g))
      next.bendTangent = `${LABELS.bendTangent} must be a number`;
    else if (g !== undefined && g < 0)
      next.bendTangent = `${LABELS.bendTangent} must be zero or more`;
    setErrors(next);
    if (Object.keys(next).length > 0) return;
    const message = onApply({
      testTemperature: t === undefined ? undefined : units.fromDisplay(t, 'temperature'),
      bendTangent: g === undefined ? undefined : units.fromDisplay(g, 'length'),
    });
    setRefusal(message);
  };

  return (
    <form
      aria-label="Shop settings"
      noValidate
      className="flex flex-col gap-2 border-t border-steel-200 pt-3"
      onSubmit={(e) => {
        e.preventDefault();
        apply();
      }}
    >
      <h3 className="text-sm font-semibold text-steel-800">Shop settings</h3>
      <p className="text-xs text-steel-500">
        Used by the fabrication sheet; empty fields take the default.
      </p>
      {refusal ? (
        <p
          role="alert"
          className="rounded border border-red-200 bg-red-50 px-2 py-1 text-sm text-red-800"
        >
          Not applied: {refusal}
        </p>
      ) : null}
      <div className="grid grid-cols-2 gap-x-3 gap-y-2">
        <TextField
          label={LABELS.testTemperature}
          unit={units.label('temperature')}
          inputMode="decimal"
          autoComplete="off"
          disabled={readOnly}
          placeholder={`default ${defaultTemp}`}
          hint="metal temperature at the test (B31.3 para. 345.4.2 ST)"
          error={errors.testTemperature}
          value={texts.testTemperature}
          onChange={(e) => setTexts((s) => ({ ...s, testTemperature: e.target.value }))}
        />
        <TextField
          label={LABELS.bendTangent}
          unit={units.label('length')}
          inputMode="decimal"
          autoComplete="off"
          disabled={readOnly}
          placeholder="default 0"
          hint="straight added at each bend end for the bending machine"
          error={errors.bendTangent}
          value={texts.bendTangent}
          onChange={(e) => setTexts((s) => ({ ...s, bendTangent: e.target.value }))}
        />
      </div>
      {readOnly ? null : (
        <div className="flex gap-2">
          <Button type="submit" variant="primary" size="sm" disabled={!dirty}>
            Apply shop settings
          </Button>
          <Button
            size="sm"
            variant="ghost"
            disabled={!dirty}
            onClick={() => {
              setTexts(stored);
              setErrors({});
            }}
          >
            Discard
          </Button>
        </div>
      )}
    </form>
  );
}
