import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ChevronLeft, ShieldCheck } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { useAppAbility } from '@/lib/ability';
import { coverageQuery } from '@/features/coverage/api/coverage-queries';
import { premisesQuery } from '@/features/premises/api/premises-queries';
import { useSiteZones } from '@/features/premises/api/site-zones';
import { PremisesEditor } from '@/features/premises/components/premises-editor';
import { siteQuery } from '@/features/sites/api/sites-queries';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  const siteId = params.siteId ?? '';
  void queryClient.prefetchQuery(siteQuery(siteId));
  void queryClient.prefetchQuery(coverageQuery(siteId));
  await queryClient.ensureQueryData(premisesQuery(siteId));
  return null;
}

export default function PremisesPage() {
  const { siteId = '' } = useParams();
  const ability = useAppAbility();
  const { data: premises } = useSuspenseQuery(premisesQuery(siteId));
  const site = useQuery(siteQuery(siteId));
  const coverage = useQuery(coverageQuery(siteId));
  const { zones, error: zonesError } = useSiteZones(siteId, premises);
  const canEdit = ability.can('update', 'Premises');
  const siteName = site.data ? [site.data.clientName, site.data.name].filter(Boolean).join(' · ') : undefined;

  return (
    <>
      <Link to={paths.firm.site(siteId)} className="mb-2 inline-flex items-center gap-1 text-sm font-medium text-brass-700 hover:underline">
        <ChevronLeft className="size-4" aria-hidden="true" />
        {siteName ?? 'Back to the site'}
      </Link>
      <div className="mb-6 flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between">
        <div className="min-w-0">
          <h1 className="text-xl font-semibold text-ink">Premises</h1>
          <p className="mt-1 text-sm text-slate-500">
            {coverage.data ? coverage.data.summary : 'Floors, rooms, doors and windows, and where each device is.'}
          </p>
        </div>
        <ButtonLink to={paths.firm.coverage(siteId)} variant="secondary" className="self-start sm:self-auto">
          <ShieldCheck className="size-4" aria-hidden="true" /> Coverage
        </ButtonLink>
      </div>
      {zonesError && <p className="mb-4 text-sm text-clay-600">The zones could not be read: {zonesError.message}</p>}
      <PremisesEditor siteId={siteId} premises={premises} zones={zones} coverage={coverage.data} canEdit={canEdit} />
    </>
  );
}
