import { useQuery, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Building, ChevronLeft } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { paths } from '@/config/paths';
import { useAppAbility } from '@/lib/ability';
import { coverageQuery } from '@/features/coverage/api/coverage-queries';
import { CoverageFloors, CoverageLegend, CoverageSummary, LifeSafetyFindings, OtherFindings } from '@/features/coverage/components/coverage-report';
import { premisesQuery } from '@/features/premises/api/premises-queries';
import { useSiteZones } from '@/features/premises/api/site-zones';
import { siteQuery } from '@/features/sites/api/sites-queries';

export async function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  const siteId = params.siteId ?? '';
  void queryClient.prefetchQuery(siteQuery(siteId));
  void queryClient.prefetchQuery(premisesQuery(siteId));
  await queryClient.ensureQueryData(coverageQuery(siteId));
  return null;
}

export default function CoveragePage() {
  const { siteId = '' } = useParams();
  const ability = useAppAbility();
  const { data: coverage } = useSuspenseQuery(coverageQuery(siteId));
  const site = useQuery(siteQuery(siteId));
  const premises = useQuery(premisesQuery(siteId));
  const { zones } = useSiteZones(siteId, premises.data);
  const canEdit = ability.can('update', 'Premises');
  const siteName = site.data ? [site.data.clientName, site.data.name].filter(Boolean).join(' · ') : undefined;
  const address = site.data?.address ? [site.data.address.line1, site.data.address.city].filter(Boolean).join(', ') : undefined;
  const editLink = (
    <ButtonLink to={paths.firm.premises(siteId)} variant="secondary">
      <Building className="size-4" aria-hidden="true" /> {canEdit ? 'Edit premises' : 'Premises'}
    </ButtonLink>
  );

  return (
    <>
      <Link to={paths.firm.site(siteId)} className="mb-2 inline-flex items-center gap-1 text-sm font-medium text-brass-700 hover:underline">
        <ChevronLeft className="size-4" aria-hidden="true" />
        {siteName ?? 'Back to the site'}
      </Link>
      <PageHeader
        title="Coverage"
        context={address ?? 'Which doors and windows are protected, and what life safety still asks for.'}
        action={editLink}
      />

      {coverage.floors.length === 0 ? (
        <EmptyState
          title="No floors recorded yet"
          action={canEdit ? <ButtonLink to={paths.firm.premises(siteId)}>Record the premises</ButtonLink> : undefined}
        >
          Coverage shows once the floors, rooms, doors and windows of this site are recorded and its zones are linked to them.
        </EmptyState>
      ) : (
        <div className="space-y-6">
          <CoverageSummary coverage={coverage} />
          {/* phones: life safety, the floors, then the intrusion gaps; desktop: the floors beside the findings */}
          <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,24rem)] lg:grid-rows-[auto_auto_1fr] lg:items-start">
            <LifeSafetyFindings coverage={coverage} className="min-w-0 lg:col-start-2 lg:row-start-1" />
            <div className="min-w-0 space-y-4 lg:col-start-1 lg:row-span-3 lg:row-start-1">
              <div className="flex flex-wrap items-center justify-between gap-3">
                <h2 className="text-lg font-semibold">Floor by floor</h2>
                <CoverageLegend />
              </div>
              <CoverageFloors coverage={coverage} planFloors={premises.data?.floors} zones={zones} />
            </div>
            <OtherFindings coverage={coverage} className="min-w-0 lg:col-start-2 lg:row-start-2" />
          </div>
        </div>
      )}
    </>
  );
}
