import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateMeasurementBody, MeasurementDetail, MeasurementResponse } from '@shared/schemas/measurements';
import { api } from '@/lib/api-client';
import { invariant } from '@/lib/invariant';
import { measurementQueryKey } from '@/features/measurements/api/get-measurement';

export async function createMeasurement(body: CreateMeasurementBody): Promise<MeasurementDetail> {
  const answer = await api.post<MeasurementResponse>('/api/measurements', body);
  invariant(answer && typeof answer.measurement?.id === 'string', 'POST /api/measurements answered 2xx without { measurement }');
  return answer.measurement;
}

export function useCreateMeasurement({ onCreated }: { onCreated?: (measurement: MeasurementDetail) => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createMeasurement,
    onSuccess: (measurement) => {
      if (Array.isArray(measurement.sweeps)) queryClient.setQueryData(measurementQueryKey(measurement.id), measurement);
      void queryClient.invalidateQueries({ queryKey: ['lenses', measurement.lens?.id ?? ''] });
      void queryClient.invalidateQueries({ queryKey: ['measurements', 'list'] });
      onCreated?.(measurement);
    },
  });
}
