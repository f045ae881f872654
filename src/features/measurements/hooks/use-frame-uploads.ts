import { useCallback, useEffect, useRef, useState, useSyncExternalStore } from 'react';
import { useQueryClient } from '@tanstack/react-query';
import { compareFrameFileNames, FRAME_MAX_BYTES, sanitiseFrameFileName, type Frame } from '@shared/schemas/frames';
import type { MeasurementDetail } from '@shared/schemas/measurements';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';
import { uploadFrame } from '@/features/measurements/api/upload-frame';
import {
  createUploadQueue,
  DEFAULT_UPLOAD_CONCURRENCY,
  splitRepeatedFileNames,
  summariseUploads,
  type UploadEntry,
  type UploadSummary,
} from '@/features/measurements/utils/upload-queue';

export interface RefusedFile {
  fileName: string;
  message: string;
}

export interface FrameUploads {
  entries: readonly UploadEntry[];
  summary: UploadSummary;
  /** Files refused before sending (wrong type, too large, a name the sweep already has). */
  refused: RefusedFile[];
  add: (files: readonly File[]) => void;
  retry: (id: string) => void;
  clearFinished: () => void;
}

function withFrame(measurement: MeasurementDetail, sweepId: string, frame: Frame): MeasurementDetail {
  return {
    ...measurement,
    sweeps: measurement.sweeps.map((sweep) =>
      sweep.id === sweepId
        ? { ...sweep, frames: [...sweep.frames.filter((f) => f.id !== frame.id), frame].sort((a, b) => compareFrameFileNames(a.fileName, b.fileName)) }
        : sweep,
    ),
  };
}

function megabytes(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/**
 * Uploads a sweep's frames a few at a time, one request per file, keeping
 * each file's progress and error; a stored frame joins the sweep's table at
 * once, and the measurement is read again when the queue falls idle.
 */
export function useFrameUploads({ measurementId, sweepId, existingFileNames }: { measurementId: string; sweepId: string; existingFileNames: readonly string[] }): FrameUploads {
  const queryClient = useQueryClient();
  const [refused, setRefused] = useState<RefusedFile[]>([]);
  const [queue] = useState(() =>
    createUploadQueue<File>({
      concurrency: DEFAULT_UPLOAD_CONCURRENCY,
      describe: (file) => ({ fileName: file.name, byteSize: file.size }),
      send: async (file, report, signal) => {
        const frame = await uploadFrame({ sweepId, file, onProgress: report, signal });
        queryClient.setQueryData<MeasurementDetail>(measurementQueryKey(measurementId), (current) => (current ? withFrame(current, sweepId, frame) : current));
      },
    }),
  );
  const entries = useSyncExternalStore(queue.subscribe, queue.getSnapshot, queue.getSnapshot);
  const summary = summariseUploads(entries);
  const existing = useRef(existingFileNames);
  existing.current = existingFileNames;

  useEffect(() => () => queue.cancelAll(), [queue]);

  const busy = summary.waiting + summary.uploading > 0;
  const wasBusy = useRef(false);
  useEffect(() => {
    if (wasBusy.current && !busy) void queryClient.invalidateQueries({ queryKey: measurementQueryKey(measurementId) });
    wasBusy.current = busy;
  }, [busy, measurementId, queryClient]);

  const add = useCallback(
    (files: readonly File[]) => {
      const refusedNow: RefusedFile[] = [];
      const acceptable: File[] = [];
      for (const file of files) {
        const sanitised = sanitiseFrameFileName(file.name);
        if (!sanitised.ok) refusedNow.push({ fileName: file.name, message: sanitised.message });
        else if (file.size > FRAME_MAX_BYTES) {
          refusedNow.push({ fileName: file.name, message: `${file.name} is ${megabytes(file.size)}; a frame may be at most ${megabytes(FRAME_MAX_BYTES)}.` });
        } else if (file.size === 0) refusedNow.push({ fileName: file.name, message: `${file.name} is empty (0 bytes).` });
        else acceptable.push(file);
      }
      const inQueue = queue.getSnapshot().filter((e) => e.status !== 'failed').map((e) => e.fileName);
      const nameOf = (file: File) => {
        const sanitised = sanitiseFrameFileName(file.name);
        return sanitised.ok ? sanitised.fileName : file.name;
      };
      const { toSend, repeated } = splitRepeatedFileNames(acceptable, nameOf, new Set([...existing.current, ...inQueue]));
      for (const name of repeated) {
        refusedNow.push({ fileName: name, message: `${name} is already in this sweep (or was dropped twice); a sweep holds each file name once.` });
      }
      setRefused(refusedNow);
      queue.add(toSend);
    },
    [queue],
  );

  return { entries, summary, refused, add, retry: queue.retry, clearFinished: () => { queue.clearFinished(); setRefused([]); } };
}
