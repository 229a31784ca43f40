import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { ChevronRight } from 'lucide-react';
import { TriangleMark } from '@/components/coverage/finding-mark';
import { Skeleton } from '@/components/ui/skeleton';
import { paths } from '@/config/paths';
import { coverageQuery, isLifeSafetyFinding } from '../api/coverage-queries';

/** The site page's card: the coverage summary line and the way to the premises and coverage pages. */
export function SiteCoverageCard({ siteId }: { siteId: string }) {
  const coverage = useQuery(coverageQuery(siteId));
  const data = coverage.data;
  const lifeSafety = data ? data.findings.filter(isLifeSafetyFinding).length : 0;
  const allCovered = data ? data.openings.total > 0 && data.openings.protected === data.openings.total : false;
  const link = 'inline-flex items-center gap-1 text-sm font-medium text-brass-700 hover:underline';
  return (
    <section className="rounded-md border border-line bg-card" aria-labelledby={`site-coverage-${siteId}`}>
      <header className="border-b border-line px-4 py-3">
        <h2 id={`site-coverage-${siteId}`} className="text-sm font-semibold text-ink">
          Premises and coverage
        </h2>
      </header>
      <div className="space-y-3 p-4">
        {coverage.isPending ? (
          <div className="space-y-2" role="status" aria-label="Loading">
            <Skeleton className="h-5 w-3/4" />
            <Skeleton className="h-4 w-1/3" />
          </div>
        ) : coverage.isError ? (
          <p className="text-sm text-clay-600">{coverage.error.message}</p>
        ) : (
          <>
            <div>
              <p className={allCovered ? 'font-medium text-sage-600' : 'font-medium text-ink'}>{data!.summary}</p>
              {data!.openings.total === 0 && (
                <p className="mt-0.5 text-sm text-slate-500">Record the floors, rooms, doors and windows to see what is protected.</p>
              )}
            </div>
            {lifeSafety > 0 && (
              <p className="flex items-center gap-2 text-sm font-medium text-clay-600">
                <TriangleMark />
                {lifeSafety === 1 ? '1 life-safety finding' : `${lifeSafety} life-safety findings`}
              </p>
            )}
          </>
        )}
        <div className="flex flex-wrap gap-x-5 gap-y-1 border-t border-line pt-3">
          <Link to={paths.firm.coverage(siteId)} className={link}>
            Coverage <ChevronRight className="size-4" aria-hidden="true" />
          </Link>
          <Link to={paths.firm.premises(siteId)} className={link}>
            Floors, rooms and plans <ChevronRight className="size-4" aria-hidden="true" />
          </Link>
        </div>
      </div>
    </section>
  );
}
