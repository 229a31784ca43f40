/**
 * A firm's public portal pages (/p/:shortName): sign-in, forgotten password, reset and
 * invitation, in the firm's colours with its logo and phone, before the household signs in.
 */
import { useEffect, type ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Outlet, useOutletContext, useParams } from 'react-router-dom';
import { publicFirmQuery } from '@/features/portal/api/portal-queries';
import { brandStyle, telHref } from '@/features/portal/brand';
import { Button } from '@/components/ui/button';
import { Skeleton } from '@/components/ui/skeleton';
import { ApiError } from '@/lib/api-client';
import type { PublicFirm } from '@/types/api';

export function PortalPublicLayout() {
  const { shortName = '' } = useParams();
  const firmQuery = useQuery(publicFirmQuery(shortName));
  const firm = firmQuery.data;
  const missing = firmQuery.error instanceof ApiError && (firmQuery.error.status === 404 || firmQuery.error.status === 400);

  useEffect(() => {
    if (firm) document.title = `${firm.name} — client portal`;
    else if (missing) document.title = 'No client portal at this address';
  }, [firm, missing]);

  if (firmQuery.isPending) return <PortalSkeleton />;
  if (!firm) {
    return (
      <PortalFrame>
        {missing ? (
          <PortalCard title="There is no client portal at this address">
            <p className="text-sm">No alarm firm uses the portal address “{shortName}”.</p>
            <p className="mt-3 text-sm text-slate-500">
              Check the link in the e-mail from your alarm firm and open it again, or copy the whole address into your browser. If it still does not
              work, call your alarm firm.
            </p>
          </PortalCard>
        ) : (
          <PortalCard title="The portal could not be opened">
            <p className="text-sm">{firmQuery.error?.message}</p>
            <Button size="lg" variant="secondary" className="mt-4 w-full" busy={firmQuery.isFetching} onClick={() => void firmQuery.refetch()}>
              Try again
            </Button>
          </PortalCard>
        )}
      </PortalFrame>
    );
  }
  return (
    <PortalFrame firm={firm}>
      <Outlet context={firm} />
    </PortalFrame>
  );
}

/** The firm whose portal page this is (for the pages inside PortalPublicLayout). */
export function usePortalFirm(): PublicFirm {
  return useOutletContext<PublicFirm>();
}

/** The card a portal page sits in: its heading, an optional introduction, then the content. */
export function PortalCard({ title, intro, children }: { title: string; intro?: ReactNode; children: ReactNode }) {
  return (
    <div className="rounded-md border border-line bg-card p-6 sm:p-8">
      <h1 className="text-xl font-semibold">{title}</h1>
      {intro && <div className="mt-2 text-sm text-slate-500">{intro}</div>}
      <div className="mt-6">{children}</div>
    </div>
  );
}

/** Class of a text link on the portal pages: the firm's colour, a 48 px touch target. */
export const portalLinkClass = 'inline-flex min-h-12 items-center font-medium text-brass-700 underline';

function PortalFrame({ firm, children }: { firm?: PublicFirm; children: ReactNode }) {
  return (
    <div className="flex min-h-dvh flex-col" style={firm ? brandStyle(firm.accentColorReadable) : undefined}>
      <header className="bg-brass-600 text-white">
        <div className="mx-auto flex min-h-16 max-w-4xl items-center gap-3 px-4 py-3">
          {firm?.logoUrl && <img src={firm.logoUrl} alt="" className="size-10 rounded-md bg-white object-contain p-1" />}
          <span className="min-w-0 truncate text-lg font-semibold">{firm?.name ?? 'Client portal'}</span>
        </div>
      </header>
      <main className="mx-auto w-full max-w-md flex-1 px-4 py-8 sm:py-12">{children}</main>
      <footer className="border-t border-line">
        <div className="mx-auto flex max-w-4xl flex-col gap-1 px-4 py-4 text-sm text-slate-500 sm:flex-row sm:items-center sm:justify-between">
          <span className="flex flex-col sm:flex-row sm:gap-6">
            {firm?.phone && <PhoneLine label={firm.name} phone={firm.phone} />}
            {firm?.monitoringCenterPhone && <PhoneLine label="Monitoring center" phone={firm.monitoringCenterPhone} />}
          </span>
          <span className="text-xs">Portal by Mullion</span>
        </div>
      </footer>
    </div>
  );
}

function PhoneLine({ label, phone }: { label: string; phone: string }) {
  return (
    <span>
      {label}:{' '}
      <a href={telHref(phone)} className={portalLinkClass}>
        {phone}
      </a>
    </span>
  );
}

function PortalSkeleton() {
  return (
    <div className="flex min-h-dvh flex-col" role="status" aria-label="Opening the portal">
      <div className="h-16 bg-slate-100" />
      <div className="mx-auto w-full max-w-md space-y-4 px-4 py-8 sm:py-12">
        <Skeleton className="h-8 w-3/4" />
        <Skeleton className="h-12 w-full" />
        <Skeleton className="h-12 w-full" />
        <Skeleton className="h-12 w-full" />
      </div>
    </div>
  );
}
