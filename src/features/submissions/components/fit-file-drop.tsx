import { type DragEvent, useId, useRef, useState } from 'react';
import type { Side } from '@shared/analysis/types';
import { formatFileSize } from '../lib/format';
import { FieldError } from './form-controls';

const SIDE_STYLE: Record<Side, { badge: string; ring: string; tint: string }> = {
  a: { badge: 'bg-ember-700 text-paper', ring: 'border-ember-500', tint: 'bg-ember-50' },
  b: { badge: 'bg-moss-700 text-paper', ring: 'border-moss-500', tint: 'bg-moss-100/60' },
};

/** Drop a FIT file here, or pick one: the file input stays the real, labelled control. */
export function FitFileDrop({
  side,
  title,
  file,
  onFile,
  error,
}: {
  side: Side;
  title: string;
  file: File | null;
  onFile: (file: File | null) => void;
  error?: string;
}) {
  const [dragging, setDragging] = useState(false);
  const inputRef = useRef<HTMLInputElement>(null);
  const inputId = `file-${side}`;
  const errorId = `${inputId}-error`;
  const hintId = useId();
  const style = SIDE_STYLE[side];

  function onDrop(event: DragEvent) {
    event.preventDefault();
    setDragging(false);
    const dropped = event.dataTransfer.files[0];
    if (dropped) onFile(dropped);
  }

  return (
    <div>
      {/* biome-ignore lint/a11y/noStaticElementInteractions: dropping a file is a pointer shortcut; the labelled file input inside is the keyboard way */}
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`relative flex flex-col gap-3 rounded-card border-2 border-dashed p-4 transition-colors sm:p-5 ${
          error
            ? 'border-alert-600 bg-alert-100/40'
            : dragging
              ? `${style.ring} ${style.tint}`
              : file
                ? `${style.ring} bg-white`
                : 'border-paper-line bg-white/70'
        }`}
      >
        <div className="flex items-center gap-3">
          <span aria-hidden="true" className={`grid h-9 w-9 shrink-0 place-items-center rounded-full text-body font-bold ${style.badge}`}>
            {side.toUpperCase()}
          </span>
          <label htmlFor={inputId} className="font-semibold text-ink">
            {title}
          </label>
        </div>
        {file ? (
          <p className="break-all text-caption text-ink-soft">
            <span className="font-medium text-ink">{file.name}</span> · {formatFileSize(file.size)}
          </p>
        ) : (
          <p id={hintId} className="text-caption text-ink-soft">
            Drop the .fit file here, or choose it from your device.
          </p>
        )}
        <div className="flex flex-wrap gap-2">
          <input
            ref={inputRef}
            id={inputId}
            name={side === 'a' ? 'fileA' : 'fileB'}
            type="file"
            accept=".fit,application/vnd.ant.fit,application/octet-stream"
            onChange={(e) => onFile(e.target.files?.[0] ?? null)}
            aria-invalid={error ? true : undefined}
            aria-describedby={error ? errorId : file ? undefined : hintId}
            className="block w-full text-caption text-ink-soft file:mr-3 file:cursor-pointer file:rounded-full file:border-0 file:bg-fjord-700 file:px-4 file:py-1.5 file:font-semibold file:text-paper hover:file:bg-fjord-900"
          />
          {file && (
            <button
              type="button"
              onClick={() => {
                if (inputRef.current) inputRef.current.value = '';
                onFile(null);
              }}
              className="text-caption font-medium text-ink-soft underline underline-offset-2 hover:text-ink"
            >
              Remove this file
            </button>
          )}
        </div>
      </div>
      <FieldError id={errorId} message={error} />
    </div>
  );
}
