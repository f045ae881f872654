import { useMutation } from '@tanstack/react-query';
import type { DocumentCheck } from '@shared/schemas/verification';
import { uploadFile } from '@/lib/upload-file';

export function checkCertificateFile({ code, file }: { code: string; file: File }): Promise<DocumentCheck> {
  return uploadFile<DocumentCheck>({ url: `/api/verification/${encodeURIComponent(code)}/document`, fieldName: 'file', file, fileName: file.name });
}

export function useCheckCertificateFile() {
  return useMutation({ mutationFn: checkCertificateFile });
}
