/** Small pieces every portal page shares: the page title, the firm's contact card, a roomy card. */
import type { ReactNode } from 'react';
import { Phone } from 'lucide-react';
import { cn } from '@/lib/cn';
import type { PortalFirmContact } from '@/types/api';
import { telHref } from '../brand';

export function PortalTitle({ title, context, action }: { title: string; context?: ReactNode; action?: ReactNode }) {
  return (
    <div className="mb-5 flex flex-wrap items-end justify-between gap-3">
      <div className="min-w-0">
        <h1 className="text-2xl font-semibold text-ink">{title}</h1>
        {context && <p className="mt-1 text-slate-500">{context}</p>}
      </div>
      {action}
    </div>
  );
}

/** A portal card: roomier than the staff app's (design-language.md, "Shape"). */
export function PortalCard({ title, children, className, action, id }: { title?: string; children: ReactNode; className?: string; action?: ReactNode; id?: string }) {
  return (
    <section aria-labelledby={title && id ? id : undefined} className={cn('rounded-md border border-line bg-card p-5', className)}>
      {title && (
        <div className="mb-3 flex items-center justify-between gap-2">
          <h2 id={id} className="text-lg font-semibold text-ink">
            {title}
          </h2>
          {action}
        </div>
      )}
      {children}
    </section>
  );
}

function PhoneLine({ label, phone }: { label: string; phone: string }) {
  return (
    <li>
      <a href={telHref(phone)} className="flex min-h-12 items-center gap-3 rounded-md border border-line px-3 py-2 hover:bg-paper">
        <Phone className="size-5 shrink-0 text-brass-700" aria-hidden="true" />
        <span className="min-w-0">
          <span className="block text-sm text-slate-500">{label}</span>
          <span className="block font-medium text-ink tabular-nums">{phone}</span>
        </span>
      </a>
    </li>
  );
}

/** Who looks after the system and how to reach them; shown on every site's home. */
export function FirmContactCard({ firm }: { firm: PortalFirmContact }) {
  return (
    <PortalCard title="Your alarm firm" id="firm-contact">
      <p className="text-sm text-slate-500">{firm.name} installs and looks after your system. Call them for anything about your alarm.</p>
      <ul className="mt-3 space-y-2">
        {firm.phone && <PhoneLine label={`${firm.name}, office`} phone={firm.phone} />}
        {firm.monitoringCenterPhone && (
          <PhoneLine label={`Monitoring center${firm.monitoringCenterName ? ` — ${firm.monitoringCenterName}` : ''}`} phone={firm.monitoringCenterPhone} />
        )}
      </ul>
      {!firm.phone && !firm.monitoringCenterPhone && <p className="mt-2 text-sm text-slate-500">Your firm has not added a phone number yet.</p>}
    </PortalCard>
  );
}
