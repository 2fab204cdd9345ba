import { useEffect, useState } from 'react';
import { conditionsText, IMAGE_ESTIMATE_CONDITIONS } from '../../../../shared/colour/conditions';
import { HEX_RE, hexToLab, labToHex } from '../../../../shared/search/lab';
import { Field } from '../../../components/form/Field';
import { Button } from '../../../components/Button';
import { useFormErrors } from '../../../lib/form';

/** As typed (strings): a wrong value reaches the URL and the server as it is, so its message names it. */
export type ShadeChoice = { hex?: string; L?: string; a?: string; b?: string; maxDeltaE: string };

// Input values stay plain ASCII numbers; a value that rounds to zero is 0.0, never -0.0.
const fmt = (x: number) => (Math.abs(x) < 0.05 ? 0 : x).toFixed(1);

/** Choose a shade by picker, by hex or by L*a*b* numbers, and a ΔE00 radius. Checked with the shared schema here, and the server's per-field details shown on the same fields. */
export function ColourChooser({
  value,
  errors,
  onSearch,
  onClear,
}: {
  value: ShadeChoice | null;
  errors?: Record<string, string[]>;
  onSearch: (c: ShadeChoice) => void;
  onClear: () => void;
}) {
  const [hex, setHex] = useState(value?.hex ?? '');
  const [lab, setLab] = useState({
    L: value?.L?.toString() ?? '',
    a: value?.a?.toString() ?? '',
    b: value?.b?.toString() ?? '',
  });
  const [radius, setRadius] = useState(String(value?.maxDeltaE ?? 5));
  const local = useFormErrors();
  // What is wrong with the shade in the URL (checked with the shared schema, or the server's 400), focused like any form's errors.
  const { show } = local;
  useEffect(() => show(errors ?? {}), [errors, show]);
  useEffect(() => {
    setHex(value?.hex ?? '');
    if (value?.hex && HEX_RE.test(value.hex)) {
      const l = hexToLab(value.hex);
      setLab({ L: fmt(l.L), a: fmt(l.a), b: fmt(l.b) });
    } else setLab({ L: value?.L?.toString() ?? '', a: value?.a?.toString() ?? '', b: value?.b?.toString() ?? '' });
    setRadius(String(value?.maxDeltaE ?? 5));
  }, [value?.hex, value?.L, value?.a, value?.b, value?.maxDeltaE]);

  const pickerHex = HEX_RE.test(hex)
    ? `#${hex.replace('#', '')}`
    : lab.L !== '' && lab.a !== '' && lab.b !== ''
      ? labToHex({ L: +lab.L, a: +lab.a, b: +lab.b })
      : '#9b2f2f';
  const fromHex = (h: string) => {
    setHex(h.replace('#', ''));
    if (HEX_RE.test(h)) {
      const l = hexToLab(h);
      setLab({ L: fmt(l.L), a: fmt(l.a), b: fmt(l.b) });
    }
  };
  // A wrong choice still goes to the URL as typed: the page checks it there, says what is wrong and drops the old results.
  const submitHex = () => onSearch({ hex: hex.replace('#', '').trim(), maxDeltaE: radius.trim() });
  const submitLab = () => onSearch({ L: lab.L.trim(), a: lab.a.trim(), b: lab.b.trim(), maxDeltaE: radius.trim() });
  const err = (k: string) => local.errors[k];

  return (
    <form
      ref={local.formRef}
      noValidate
      aria-label="Shade"
      className="rounded-lg border border-rule bg-sheet p-4 space-y-3"
      onSubmit={(e) => {
        e.preventDefault();
        submitHex();
      }}
    >
      <h2 className="text-sm font-semibold uppercase tracking-wide text-ink-soft">Shade</h2>
      <div className="flex items-end gap-3">
        <label className="block text-sm font-medium">
          Picker
          <input
            type="color"
            className="mt-1 block h-10 w-14 rounded border border-rule-strong bg-neutral-ground p-1"
            value={pickerHex}
            onChange={(e) => fromHex(e.target.value)}
          />
        </label>
        <Field
          label="Hex"
          value={hex}
          onChange={(e) => setHex(e.target.value)}
          placeholder="9b2f2f"
          className="flex-1 font-mono"
          error={err('hex')}
        />
      </div>
      <p className="text-xs text-ink-soft">
        CIELAB under {conditionsText(IMAGE_ESTIMATE_CONDITIONS)}, the conditions of the palettes searched (image
        estimates); a hex is read as sRGB.
      </p>
      <div className="grid grid-cols-3 gap-2">
        <Field
          label="L*"
          inputMode="decimal"
          className="num"
          value={lab.L}
          onChange={(e) => setLab({ ...lab, L: e.target.value })}
          error={err('L')}
        />
        <Field
          label="a*"
          inputMode="decimal"
          className="num"
          value={lab.a}
          onChange={(e) => setLab({ ...lab, a: e.target.value })}
          error={err('a')}
        />
        <Field
          label="b*"
          inputMode="decimal"
          className="num"
          value={lab.b}
          onChange={(e) => setLab({ ...lab, b: e.target.value })}
          error={err('b')}
        />
      </div>
      <Field
        label="Radius"
        unit="ΔE00"
        inputMode="decimal"
        className="num"
        value={radius}
        onChange={(e) => setRadius(e.target.value)}
        error={err('maxDeltaE')}
        hint="Default 5; 1 is barely visible, above 5 a clearly different shade (common practice)."
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit">Find this hex</Button>
        <Button type="button" variant="secondary" onClick={submitLab}>
          Find these L*a*b*
        </Button>
        {value ? (
          <Button type="button" variant="quiet" onClick={onClear}>
            Clear shade
          </Button>
        ) : null}
      </div>
    </form>
  );
}
