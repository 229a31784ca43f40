import { queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { ApiCoverage, ApiCoverageFinding } from '@/types/api';

export const coverageKeys = {
  all: ['coverage'] as const,
  site: (siteId: string) => [...coverageKeys.all, siteId] as const,
};

/**
 * A site's coverage, computed by the server from the premises and the zones. Zones change on
 * other pages, so it is read afresh whenever a page showing it opens.
 */
export const coverageQuery = (siteId: string) =>
  queryOptions({
    queryKey: coverageKeys.site(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiCoverage }>(`/api/sites/${siteId}/coverage`, signal).then((r) => r.data),
    staleTime: 0,
  });

/** Smoke and CO findings: the server marks them; older answers are known by their code. */
export function isLifeSafetyFinding(finding: ApiCoverageFinding): boolean {
  return finding.lifeSafety ?? /^(smoke|co|heat)_/.test(finding.code);
}
