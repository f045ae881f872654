import { FRAME_UPLOAD_FIELD, type Frame, type FrameResponse } from '@shared/schemas/frames';
import { invariant } from '@/lib/invariant';
import { uploadFile } from '@/lib/upload-file';

export interface UploadFrameOptions {
  sweepId: string;
  file: File;
  onProgress?: (sentBytes: number, totalBytes: number) => void;
  signal?: AbortSignal;
}

/** One image per request, so each file has its own progress and its own answer. */
export async function uploadFrame({ sweepId, file, onProgress, signal }: UploadFrameOptions): Promise<Frame> {
  const answer = await uploadFile<FrameResponse>({
    url: `/api/sweeps/${encodeURIComponent(sweepId)}/frames`,
    fieldName: FRAME_UPLOAD_FIELD,
    file,
    fileName: file.name,
    onProgress,
    signal,
  });
  invariant(answer && typeof answer.frame?.id === 'string', 'POST /api/sweeps/:sweepId/frames answered 2xx without { frame }');
  return answer.frame;
}
