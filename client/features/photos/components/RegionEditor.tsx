import { useRef, useState, type PointerEvent } from 'react';
import {
  REGION_PURPOSES,
  rectIssues,
  rectSchema,
  regionCreateSchema,
  type Rect,
  type RegionPurpose,
} from '../../../../shared/schemas/photo';
import { Button } from '../../../components/Button';
import { Field } from '../../../components/form/Field';
import { formMessage, useFormErrors } from '../../../lib/form';
import type { Photo } from '../../pieces';
import { useAddRegion, useReferencePatch } from '../api';

export const PURPOSE_LABELS: Record<RegionPurpose, string> = {
  'colour-area': 'colour area',
  motif: 'motif',
  exclusion: 'exclusion (leave out)',
  'reference-patch': 'grey reference patch',
  'sampling-site': 'sampling site',
};
const OUTLINE: Record<RegionPurpose, string> = {
  'colour-area': '#ffffff',
  motif: '#ffffff',
  exclusion: '#000000',
  'reference-patch': '#ffffff',
  'sampling-site': '#000000',
};

type Draft = { x: string; y: string; w: string; h: string };
const toDraft = (r: Rect): Draft => ({ x: String(r.x), y: String(r.y), w: String(r.w), h: String(r.h) });

/**
 * Draw a rectangle on the photo with the mouse (or type x, y, width and height in
 * pixels of the master), choose what it is for, and save it; the palette follows.
 */
export function RegionEditor({ photo, canEdit }: { photo: Photo; canEdit: boolean }) {
  const img = useRef<HTMLImageElement>(null);
  const [drag, setDrag] = useState<{ x0: number; y0: number } | null>(null);
  const [draft, setDraft] = useState<Draft>({ x: '', y: '', w: '', h: '' });
  const [purpose, setPurpose] = useState<RegionPurpose>('colour-area');
  const [label, setLabel] = useState('');
  const { formRef, errors, check, show, fromServer } = useFormErrors();
  const addRegion = useAddRegion(photo);
  const setPatch = useReferencePatch(photo);

  // Screen pixels → master pixels: regions are stored against the full-size image.
  const toMaster = (e: PointerEvent) => {
    const box = img.current!.getBoundingClientRect();
    const sx = photo.width / box.width;
    const sy = photo.height / box.height;
    return {
      x: Math.round(Math.min(Math.max(e.clientX - box.left, 0), box.width) * sx),
      y: Math.round(Math.min(Math.max(e.clientY - box.top, 0), box.height) * sy),
    };
  };
  const onDown = (e: PointerEvent) => {
    if (!canEdit) return;
    e.currentTarget.setPointerCapture(e.pointerId);
    const p = toMaster(e);
    setDrag({ x0: p.x, y0: p.y });
    setDraft(toDraft({ x: p.x, y: p.y, w: 1, h: 1 }));
  };
  const onMove = (e: PointerEvent) => {
    if (!drag) return;
    const p = toMaster(e);
    setDraft(
      toDraft({
        x: Math.min(drag.x0, p.x),
        y: Math.min(drag.y0, p.y),
        w: Math.max(1, Math.abs(p.x - drag.x0)),
        h: Math.max(1, Math.abs(p.y - drag.y0)),
      }),
    );
  };

  const rect = rectSchema.safeParse({ x: Number(draft.x), y: Number(draft.y), w: Number(draft.w), h: Number(draft.h) });
  const pct = (v: number, of: number) => `${(v / of) * 100}%`;
  const box = (r: Rect) => ({
    left: pct(r.x, photo.width),
    top: pct(r.y, photo.height),
    width: pct(r.w, photo.width),
    height: pct(r.h, photo.height),
  });

  // An empty box is missing (its message says so); text that is not a number stays as typed, so its message asks for pixels.
  const px = (v: string) => (v.trim() === '' ? undefined : Number.isNaN(Number(v)) ? v : Number(v));

  async function save() {
    const rectRaw = { x: px(draft.x), y: px(draft.y), w: px(draft.w), h: px(draft.h) };
    // The route's own schema: a reference patch is a bare rectangle, a region also says what it is for.
    const data =
      purpose === 'reference-patch'
        ? check(rectSchema, rectRaw)
        : check(regionCreateSchema, { ...rectRaw, purpose, label: label.trim() || null });
    if (!data) return;
    // What the schema cannot know: the size of this photo.
    const outside = rectIssues(data, photo);
    if (Object.keys(outside).length) return show(outside);
    try {
      const rect = { x: data.x, y: data.y, w: data.w, h: data.h };
      if (purpose === 'reference-patch') await setPatch.mutateAsync(rect);
      else await addRegion.mutateAsync({ ...rect, purpose, label: label.trim() || null });
      setDraft({ x: '', y: '', w: '', h: '' });
      setLabel('');
    } catch (e) {
      const message = formMessage(e);
      if (message) show({ _: [message] });
      else fromServer(e);
    }
  }

  return (
    <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
      <div
        className="relative select-none bg-neutral-ground touch-none"
        onPointerDown={onDown}
        onPointerMove={onMove}
        onPointerUp={() => setDrag(null)}
      >
        <img
          ref={img}
          src={photo.urls.display}
          alt={photo.caption ?? `Photo ${photo.id}`}
          className="block w-full"
          draggable={false}
        />
        {photo.regions.map((r) => (
          <div
            key={r.id}
            className="pointer-events-none absolute border-2 border-dashed"
            style={{ ...box(r), borderColor: OUTLINE[r.purpose] }}
          >
            <span className="absolute left-0 top-0 bg-ink/70 px-1 text-[10px] text-white">
              {r.label ?? PURPOSE_LABELS[r.purpose]}
            </span>
          </div>
        ))}
        {photo.referencePatch ? (
          <div
            className="pointer-events-none absolute border-2 border-white outline outline-1 outline-black"
            style={box(photo.referencePatch)}
          >
            <span className="absolute left-0 top-0 bg-ink/70 px-1 text-[10px] text-white">reference patch</span>
          </div>
        ) : null}
        {rect.success ? (
          <div
            className="pointer-events-none absolute border-2 border-action bg-action/20"
            style={box(rect.data)}
            data-testid="region-draft"
          />
        ) : null}
      </div>
      {canEdit ? (
        <form
          ref={formRef}
          className="space-y-3"
          onSubmit={(e) => {
            e.preventDefault();
            void save();
          }}
          aria-label="New region"
        >
          <p className="text-sm text-ink-soft">
            Drag on the photo, or type the rectangle in pixels of the master ({photo.width} × {photo.height} px).
          </p>
          <div className="grid grid-cols-2 gap-2">
            {(['x', 'y', 'w', 'h'] as const).map((k) => (
              <Field
                key={k}
                label={{ x: 'x', y: 'y', w: 'Width', h: 'Height' }[k]}
                unit="px"
                inputMode="numeric"
                className="num"
                value={draft[k]}
                onChange={(e) => setDraft((d) => ({ ...d, [k]: e.target.value }))}
                error={errors[k]}
              />
            ))}
          </div>
          <label className="block text-sm font-medium">
            Purpose
            <select
              className="mt-1 block w-full rounded-md border border-rule-strong bg-sheet px-2 py-2 text-sm"
              value={purpose}
              onChange={(e) => setPurpose(e.target.value as RegionPurpose)}
            >
              {REGION_PURPOSES.map((p) => (
                <option key={p} value={p}>
                  {PURPOSE_LABELS[p]}
                </option>
              ))}
            </select>
          </label>
          {purpose !== 'reference-patch' ? (
            <Field
              label="Label"
              hint="e.g. madder red ground, pencilled blue"
              value={label}
              onChange={(e) => setLabel(e.target.value)}
              error={errors.label}
            />
          ) : null}
          {errors._ ? (
            <p role="alert" className="text-sm text-danger">
              {errors._.join(' ')}
            </p>
          ) : null}
          <Button type="submit" disabled={addRegion.isPending || setPatch.isPending}>
            {addRegion.isPending || setPatch.isPending
              ? 'Measuring…'
              : purpose === 'reference-patch'
                ? 'Mark reference patch'
                : 'Save region'}
          </Button>
        </form>
      ) : null}
    </div>
  );
}
