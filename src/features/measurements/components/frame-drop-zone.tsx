import { useDropzone } from 'react-dropzone';
import { FRAME_EXTENSIONS_SENTENCE, FRAME_MAX_BYTES } from '@shared/schemas/frames';

export interface FrameDropZoneProps {
  onFiles: (files: File[]) => void;
  disabled: boolean;
  /** Why dropping is not possible now; shown in place of the invitation. */
  disabledReason?: string;
  sweepLabel: string;
}

/** A drop area (or file picker) for many frames at once. Checks happen in the upload hook so every refusal gets a sentence. */
export function FrameDropZone({ onFiles, disabled, disabledReason, sweepLabel }: FrameDropZoneProps) {
  const { getRootProps, getInputProps, isDragActive } = useDropzone({
    onDrop: (accepted, rejected) => onFiles([...accepted, ...rejected.map((r) => r.file)]),
    multiple: true,
    disabled,
  });
  return (
    <div
      {...getRootProps({
        'aria-label': `Drop frames for ${sweepLabel}, or press to choose files`,
      })}
      className={`flex cursor-pointer flex-col items-center justify-center gap-1 rounded-sheet border-2 border-dashed px-4 py-5 text-center transition-colors ${
        disabled
          ? 'cursor-not-allowed border-rule bg-shade/40 text-ink-faint'
          : isDragActive
            ? 'border-ink bg-shade text-ink'
            : 'border-rule-strong bg-sheet text-ink-soft hover:border-ink-soft hover:bg-shade/40'
      }`}
      data-role="frame-drop-zone"
    >
      <input {...getInputProps()} data-role="frame-file-input" />
      <svg viewBox="0 0 32 24" className="h-6 w-8" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="1.4">
        <rect x="1.5" y="4.5" width="20" height="15" rx="1" />
        <rect x="6.5" y="1.5" width="20" height="15" rx="1" fill="var(--color-sheet)" />
        <rect x="10.5" y="7.5" width="20" height="15" rx="1" fill="var(--color-sheet)" />
        <circle cx="17" cy="15" r="1.4" fill="currentColor" />
        <circle cx="24" cy="15" r="1.4" fill="currentColor" />
      </svg>
      {disabled ? (
        <p className="text-small">{disabledReason}</p>
      ) : (
        <>
          <p className="text-body font-medium text-ink">{isDragActive ? 'Release to upload' : 'Drop the through-focus frames here, or click to choose'}</p>
          <p className="text-caption text-ink-faint">
            Many at once · {FRAME_EXTENSIONS_SENTENCE} · 8- or 16-bit · up to {FRAME_MAX_BYTES / 1024 / 1024} MB each
          </p>
        </>
      )}
    </div>
  );
}
