import { useRef, useState, type DragEvent } from 'react';
import { uploadPhotoResumable, useUploadDone } from '../api';
import {
  DEFAULT_MEDIA_MAX_BYTES,
  DEFAULT_MEDIA_MAX_PIXELS,
  pixelsInWords,
  sizeInWords,
} from '../../../../shared/schemas/photo';

type Item = {
  key: string;
  name: string;
  bytes: number;
  phase: 'uploading' | 'processing' | 'done' | 'failed';
  progress: number;
  message?: string;
};

const MB = 1024 * 1024;

/**
 * Drop or pick several photos; each goes up on its own (resumable: tus) with a progress bar, then shows processing.
 */
export function UploadPanel({ pieceId }: { pieceId: number }) {
  const [items, setItems] = useState<Item[]>([]);
  const [over, setOver] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const done = useUploadDone(pieceId);
  const patch = (key: string, p: Partial<Item>) =>
    setItems((all) => all.map((i) => (i.key === key ? { ...i, ...p } : i)));

  function start(files: FileList | File[]) {
    for (const file of Array.from(files)) {
      const key = `${file.name}-${file.size}-${Math.random()}`;
      setItems((all) => [...all, { key, name: file.name, bytes: file.size, phase: 'uploading', progress: 0 }]);
      uploadPhotoResumable(pieceId, file, {
        progress: (f) => patch(key, { progress: f }),
        uploaded: () => patch(key, { phase: 'processing', progress: 1 }),
      })
        .then(() => {
          patch(key, { phase: 'done' });
          done();
        })
        .catch((e: Error) => patch(key, { phase: 'failed', message: e.message }));
    }
  }

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setOver(false);
    if (e.dataTransfer.files.length) start(e.dataTransfer.files);
  };

  return (
    <section aria-label="Add photos" className="space-y-3">
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setOver(true);
        }}
        onDragLeave={() => setOver(false)}
        onDrop={onDrop}
        className={`rounded-lg border-2 border-dashed p-6 text-center text-sm ${over ? 'border-action bg-action-tint' : 'border-rule-strong bg-sheet'}`}
      >
        <p>
          Drop photos here (JPEG, PNG, TIFF including 16-bit and BigTIFF, WebP, HEIF/AVIF; up to{' '}
          {sizeInWords(DEFAULT_MEDIA_MAX_BYTES)} and {pixelsInWords(DEFAULT_MEDIA_MAX_PIXELS)} each unless your archive
          set other limits), or
        </p>
        <button
          type="button"
          className="mt-2 rounded-md border border-rule-strong bg-sheet px-4 py-2 font-medium hover:bg-paper"
          onClick={() => input.current?.click()}
        >
          Choose photos…
        </button>
        <input
          ref={input}
          type="file"
          multiple
          accept="image/*,.tif,.tiff,.heic,.heif,.avif"
          className="sr-only"
          aria-label="Photos to upload"
          onChange={(e) => {
            if (e.target.files?.length) start(e.target.files);
            e.target.value = '';
          }}
        />
      </div>
      {items.length ? (
        <ul className="space-y-2" aria-live="polite">
          {items.map((i) => (
            <li key={i.key} className="rounded-md border border-rule bg-sheet p-3 text-sm" data-testid="upload-item">
              <div className="flex justify-between gap-2">
                <span className="truncate">{i.name}</span>
                <span className="num text-ink-soft">{(i.bytes / MB).toFixed(1)} MB</span>
              </div>
              {i.phase === 'failed' ? (
                <p className="mt-1 text-danger" role="alert">
                  {i.message}
                </p>
              ) : (
                <>
                  <progress
                    className="mt-2 h-2 w-full"
                    max={1}
                    value={i.phase === 'processing' ? undefined : i.phase === 'done' ? 1 : i.progress}
                    aria-label={`${i.name}: ${i.phase}`}
                  />
                  <p className="mt-1 text-xs text-ink-soft num">
                    {i.phase === 'uploading'
                      ? `Uploading ${Math.round(i.progress * 100)} %`
                      : i.phase === 'processing'
                        ? 'Checking the file and keeping the master…'
                        : 'Stored: previews, palette and deep zoom follow on the photo below'}
                  </p>
                </>
              )}
            </li>
          ))}
        </ul>
      ) : null}
    </section>
  );
}
