import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { redirect } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useSession } from '@/lib/auth';
import { portalSitesQuery } from '@/features/portal/api/portal-queries';
import { FirmContactCard, PortalTitle } from '@/features/portal/components/portal-parts';
import { EmptyState } from '@/components/ui/empty-state';

/** The portal's front door: straight to the household's (first) home. */
export async function loader(queryClient: QueryClient) {
  const sites = await queryClient.ensureQueryData(portalSitesQuery());
  const first = sites[0];
  return first ? redirect(paths.portal.site(first.id)) : null;
}

/** Only reached when the firm has not recorded a site for this household yet. */
export default function PortalHomePage() {
  const { tenant, user } = useSession();
  useSuspenseQuery(portalSitesQuery());
  return (
    <div className="space-y-6">
      <PortalTitle title={`Hello, ${user?.name.split(' ')[0] ?? ''}`} />
      <EmptyState title="Your home is not in the portal yet">
        {tenant?.name ?? 'Your alarm firm'} has not finished recording your home. Once they have, you will see which doors and windows are protected, your devices and your visits here.
      </EmptyState>
      {tenant && (
        <FirmContactCard firm={{ name: tenant.name, phone: tenant.phone ?? '', monitoringCenterName: tenant.monitoringCenterName, monitoringCenterPhone: tenant.monitoringCenterPhone }} />
      )}
    </div>
  );
}
