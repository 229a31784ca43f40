import { useNavigate } from 'react-router-dom';
import { Phone } from 'lucide-react';
import { paths } from '@/config/paths';
import { useSession, useSignOut } from '@/lib/auth';

/**
 * The client's portal, in the firm's colours. The firm's contact details are always
 * visible; the home's protection appears here once the firm has recorded the site.
 */
export default function PortalHomePage() {
  const { tenant, user } = useSession();
  const signOut = useSignOut();
  const navigate = useNavigate();
  const accent = tenant?.accentColorReadable ?? '#8f5c17';
  return (
    <div className="min-h-dvh">
      <header className="text-white" style={{ backgroundColor: accent }}>
        <div className="mx-auto flex h-16 max-w-4xl items-center justify-between gap-3 px-4">
          <span className="flex min-w-0 items-center gap-3">
            {tenant?.logoUrl && <img src={tenant.logoUrl} alt="" className="size-9 rounded-md bg-white object-contain p-0.5" />}
            <span className="truncate font-semibold">{tenant?.name}</span>
          </span>
          <button type="button" className="rounded-md px-3 py-2 text-sm hover:bg-white/10" onClick={() => signOut.mutate(undefined, { onSettled: () => void navigate(paths.signIn) })}>
            Sign out
          </button>
        </div>
      </header>
      <main className="mx-auto max-w-4xl space-y-6 px-4 py-8">
        <h1 className="text-xl font-semibold">Hello, {user?.name.split(' ')[0]}</h1>
        <section className="rounded-md border border-line bg-card p-5">
          <h2 className="font-semibold">Your alarm firm</h2>
          <p className="mt-1 text-sm text-slate-500">{tenant?.name} looks after your system. Call them for anything about your alarm.</p>
          {tenant?.monitoringCenterPhone && (
            <p className="mt-3 flex items-center gap-2 text-sm">
              <Phone className="size-4" aria-hidden="true" /> Monitoring center{tenant.monitoringCenterName ? ` (${tenant.monitoringCenterName})` : ''}:{' '}
              <a className="font-medium underline" href={`tel:${tenant.monitoringCenterPhone.replace(/[^0-9+]/g, '')}`}>
                {tenant.monitoringCenterPhone}
              </a>
            </p>
          )}
        </section>
      </main>
    </div>
  );
}
