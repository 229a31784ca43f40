import { keepPreviousData, queryOptions, useMutation, useQueries, useQueryClient } from '@tanstack/react-query';
import type { JobKind, JobState, WalkTestResult } from '@domain/jobs';
import type { JobCreateInput } from '@domain/schemas/job';
import { api, uploadWithProgress } from '@/lib/api-client';
import type { ApiHistoryEntry, ApiHistoryType, ApiJob, ApiJobFile, ApiPanel, ApiSite, ApiUser, ApiZone, ListResponse } from '@/types/api';

export interface JobFilters {
  page: number;
  pageSize: number;
  sort?: string | undefined;
  q?: string | undefined;
  state?: JobState | undefined;
  kind?: JobKind | undefined;
  technicianId?: string | undefined;
  siteId?: string | undefined;
  /** ISO instants: jobs starting in [from, to) */
  from?: string | undefined;
  to?: string | undefined;
}

export const jobKeys = {
  all: ['jobs'] as const,
  lists: () => [...jobKeys.all, 'list'] as const,
  list: (filters: JobFilters) => [...jobKeys.lists(), filters] as const,
  details: () => [...jobKeys.all, 'detail'] as const,
  detail: (id: string) => [...jobKeys.details(), id] as const,
  histories: () => [...jobKeys.all, 'history'] as const,
  history: (siteId: string, type: ApiHistoryType | undefined, page: number) => [...jobKeys.histories(), siteId, { type, page }] as const,
  /** what the job screens read of other resources, under their own keys */
  sites: () => [...jobKeys.all, 'site'] as const,
  site: (siteId: string) => [...jobKeys.sites(), siteId] as const,
  siteSearch: (q: string) => [...jobKeys.all, 'site-search', q] as const,
  siteZones: (siteId: string) => [...jobKeys.all, 'site-zones', siteId] as const,
  technicians: () => [...jobKeys.all, 'technicians'] as const,
};

function listParams(filters: JobFilters): string {
  const params = new URLSearchParams({ page: String(filters.page), pageSize: String(filters.pageSize) });
  for (const key of ['sort', 'q', 'state', 'kind', 'technicianId', 'siteId', 'from', 'to'] as const) {
    const value = filters[key];
    if (value) params.set(key, value);
  }
  return params.toString();
}

export const jobListQuery = (filters: JobFilters) =>
  queryOptions({
    queryKey: jobKeys.list(filters),
    queryFn: ({ signal }) => api.get<ListResponse<ApiJob>>(`/api/jobs?${listParams(filters)}`, signal),
    placeholderData: keepPreviousData,
  });

export const jobQuery = (id: string) =>
  queryOptions({
    queryKey: jobKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ data: ApiJob }>(`/api/jobs/${id}`, signal).then((r) => r.data),
  });

export const HISTORY_PAGE_SIZE = 10;

export const siteHistoryQuery = (siteId: string, type: ApiHistoryType | undefined, page: number) =>
  queryOptions({
    queryKey: jobKeys.history(siteId, type, page),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ page: String(page), pageSize: String(HISTORY_PAGE_SIZE) });
      if (type) params.set('type', type);
      return api.get<ListResponse<ApiHistoryEntry>>(`/api/sites/${siteId}/history?${params.toString()}`, signal);
    },
    placeholderData: keepPreviousData,
  });

// --- What jobs read of sites, panels, zones and staff ------------------------------------------

export const jobSiteQuery = (siteId: string) =>
  queryOptions({
    queryKey: jobKeys.site(siteId),
    queryFn: ({ signal }) => api.get<{ data: ApiSite }>(`/api/sites/${siteId}`, signal).then((r) => r.data),
    staleTime: 5 * 60_000,
  });

/** Sites matching a search, for the new-job site picker. */
export const siteSearchQuery = (q: string) =>
  queryOptions({
    queryKey: jobKeys.siteSearch(q),
    queryFn: ({ signal }) => {
      const params = new URLSearchParams({ page: '1', pageSize: '8', sort: 'name' });
      if (q) params.set('q', q);
      return api.get<ListResponse<ApiSite>>(`/api/sites?${params.toString()}`, signal).then((r) => r.data);
    },
  });

export interface SiteZones {
  panels: ApiPanel[];
  /** every zone of the site's panels that holds a number, by panel then zone number */
  zones: (ApiZone & { panelLabel: string })[];
}

/** The zones of every panel of a site (a site has one or a few panels). */
export const siteZonesQuery = (siteId: string) =>
  queryOptions({
    queryKey: jobKeys.siteZones(siteId),
    queryFn: async ({ signal }): Promise<SiteZones> => {
      const panels = await api.get<{ data: ApiPanel[] }>(`/api/sites/${siteId}/panels?pageSize=100`, signal).then((r) => r.data);
      const lists = await Promise.all(
        panels.map((p) => api.get<{ data: ApiZone[] }>(`/api/panels/${p.id}/zones?page=1&pageSize=1000`, signal).then((r) => r.data)),
      );
      const zones = panels.flatMap((p, i) =>
        (lists[i] ?? [])
          .filter((z) => z.status !== 'removed')
          .map((z) => ({ ...z, panelLabel: p.label }))
          .sort((a, b) => a.number - b.number),
      );
      return { panels, zones };
    },
  });

/** Active technicians of the firm, by name. */
export const techniciansQuery = () =>
  queryOptions({
    queryKey: jobKeys.technicians(),
    queryFn: ({ signal }) =>
      api
        .get<ListResponse<ApiUser>>('/api/staff?page=1&pageSize=100&sort=name', signal)
        .then((r) => r.data.filter((u) => u.role === 'technician' && u.active !== false && !u.deactivatedAt)),
    staleTime: 5 * 60_000,
  });

/** Each listed site's time zone (shared cache with the job pages); `fallback` until it is known. */
export function useSiteTimeZones(jobs: readonly Pick<ApiJob, 'siteId' | 'siteTimeZone'>[], fallback: string): (siteId: string) => string {
  const known = new Map<string, string>();
  for (const j of jobs) if (j.siteTimeZone) known.set(j.siteId, j.siteTimeZone);
  const missing = [...new Set(jobs.filter((j) => !known.has(j.siteId)).map((j) => j.siteId))];
  const results = useQueries({ queries: missing.map((id) => jobSiteQuery(id)) });
  missing.forEach((id, i) => {
    const tz = results[i]?.data?.timeZone;
    if (tz) known.set(id, tz);
  });
  return (siteId: string) => known.get(siteId) ?? fallback;
}

// --- Changes -----------------------------------------------------------------------------------

export type JobPatch = Partial<
  Pick<
    ApiJob,
    | 'kind'
    | 'summary'
    | 'clientNotes'
    | 'internalNotes'
    | 'parts'
    | 'checklist'
    | 'touchedZoneIds'
    | 'scheduledStart'
    | 'scheduledEnd'
    | 'technicianId'
  >
>;

export interface TransitionInput {
  to: JobState;
  cancelReason?: string;
  batteryChangedZoneIds?: string[];
}

export interface WalkTestInput {
  zoneId: string;
  result: WalkTestResult;
  monitoringConfirmed: boolean;
  note: string;
}

/** After a job changed: its detail (from the answer), every list, and the service histories. */
function useJobChanged() {
  const queryClient = useQueryClient();
  return (job: ApiJob) => {
    queryClient.setQueryData(jobKeys.detail(job.id), job);
    return Promise.all([
      queryClient.invalidateQueries({ queryKey: jobKeys.lists() }),
      queryClient.invalidateQueries({ queryKey: jobKeys.histories() }),
    ]);
  };
}

export function useCreateJob() {
  const changed = useJobChanged();
  return useMutation({
    mutationFn: (input: JobCreateInput) => api.post<{ data: ApiJob }>('/api/jobs', input).then((r) => r.data),
    onSuccess: (job) => changed(job),
  });
}

export function useUpdateJob(jobId: string) {
  const changed = useJobChanged();
  return useMutation({
    mutationFn: (patch: JobPatch) => api.patch<{ data: ApiJob }>(`/api/jobs/${jobId}`, patch).then((r) => r.data),
    onSuccess: (job) => changed(job),
  });
}

/** Reschedule any job (the schedule's drag and drop): the job id travels with the change. */
export function useRescheduleJob() {
  const changed = useJobChanged();
  return useMutation({
    mutationFn: ({ jobId, patch }: { jobId: string; patch: JobPatch }) =>
      api.patch<{ data: ApiJob }>(`/api/jobs/${jobId}`, patch).then((r) => r.data),
    onSuccess: (job) => changed(job),
  });
}

export function useTransitionJob(jobId: string) {
  const changed = useJobChanged();
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: TransitionInput) => api.post<{ data: ApiJob }>(`/api/jobs/${jobId}/transitions`, input).then((r) => r.data),
    onSuccess: async (job, input) => {
      await changed(job);
      // completion may have set batteries' changed dates and written change-log rows
      if (input.to === 'completed' && input.batteryChangedZoneIds?.length)
        await Promise.all([
          queryClient.invalidateQueries({ queryKey: jobKeys.siteZones(job.siteId) }),
          queryClient.invalidateQueries({ queryKey: ['zones'] }),
          queryClient.invalidateQueries({ queryKey: ['panels'] }),
        ]);
    },
  });
}

export function useSaveWalkTest(jobId: string) {
  const changed = useJobChanged();
  return useMutation({
    mutationFn: (rows: WalkTestInput[]) => api.put<{ data: ApiJob }>(`/api/jobs/${jobId}/walk-test`, rows).then((r) => r.data),
    onSuccess: (job) => changed(job),
  });
}

export function useUploadJobFile(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ form, onProgress }: { form: FormData; onProgress: (fraction: number) => void }) =>
      uploadWithProgress<{ data: ApiJobFile }>(`/api/jobs/${jobId}/files`, form, onProgress).then((r) => r.data),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobKeys.detail(jobId) }),
  });
}

export const jobUrls = {
  file: (documentId: string) => `/api/documents/${documentId}/file`,
  thumbnail: (documentId: string) => `/api/documents/${documentId}/thumbnail`,
  report: (jobId: string) => `/api/jobs/${jobId}/report.pdf`,
};
