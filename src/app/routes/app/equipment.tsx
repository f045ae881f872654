import { RegionErrorBoundary } from '@/components/errors/region-error-boundary';
import { PageHeader } from '@/components/ui/page-header';
import { hasAnyRole } from '@/lib/authorization';
import { useCurrentUser } from '@/features/auth/api/get-current-user';
import { EquipmentRegister } from '@/features/equipment/components/equipment-register';
import { useTodayIsoDate } from '@/features/equipment/hooks/use-today';

export function EquipmentRoute() {
  const { data: user } = useCurrentUser();
  const todayIsoDate = useTodayIsoDate();
  const canAdminister = user ? hasAnyRole(user, ['admin']) : false;
  return (
    <div className="space-y-6">
      <title>Equipment register · Paraxia</title>
      <PageHeader kicker="Lab" title="Equipment register">
        The cameras, targets, scales and reference optics behind every result, with the calibration each value comes
        from.{canAdminister ? '' : ' Administrators keep the register up to date.'}
      </PageHeader>
      <RegionErrorBoundary region="Equipment register">
        <EquipmentRegister canAdminister={canAdminister} todayIsoDate={todayIsoDate} />
      </RegionErrorBoundary>
    </div>
  );
}
