import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ArrowLeft, Pencil } from 'lucide-react';
import { formatCents } from '@domain/plans';
import { paths } from '@/config/paths';
import { Badge } from '@/components/ui/badge';
import { ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { useAppAbility } from '@/lib/ability';
import { formatDate } from '@/lib/format';
import { SiteCoverageCard } from '@/features/coverage/components/site-coverage-card';
import { NewJobButton, ServiceHistoryCard } from '@/features/jobs/components/service-history';
import { SitePanels } from '@/features/panels/components/site-panels';
import { siteQuery } from '@/features/sites/api/sites-queries';
import { EmergencyContacts } from '@/features/sites/components/emergency-contacts';
import { PasscodeReveal } from '@/features/sites/components/passcode-reveal';
import { SiteDocuments } from '@/features/sites/components/site-documents';
import { dateState, contractEndsOn } from '@/features/sites/site-dates';

export function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  return queryClient.ensureQueryData(siteQuery(params.siteId ?? ''));
}

function Row({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    <div className="grid grid-cols-[9rem_1fr] gap-2 py-1 text-sm">
      <dt className="text-slate-500">{label}</dt>
      <dd className="min-w-0">{children}</dd>
    </div>
  );
}

export default function SitePage() {
  const { siteId = '' } = useParams();
  const { data: site } = useSuspenseQuery(siteQuery(siteId));
  const ability = useAppAbility();
  const canEdit = ability.can('update', 'Site');
  const navigate = useNavigate();
  const a = site.address;
  const today = new Date().toISOString().slice(0, 10);
  const permit = dateState(site.permit.expiresOn, today);
  const contractEnd = site.contract ? contractEndsOn(site.contract.startsOn, site.contract.termMonths) : null;

  return (
    <>
      <Link to={paths.firm.client(site.clientId)} className="mb-4 inline-flex items-center gap-1 text-sm text-slate-500 hover:text-ink">
        <ArrowLeft className="size-4" aria-hidden="true" /> {site.clientName ?? 'Client'}
      </Link>
      <PageHeader
        title={site.name}
        context={`${a.line1}${a.line2 ? `, ${a.line2}` : ''}, ${a.city}${a.region ? `, ${a.region}` : ''} ${a.postalCode}`}
        action={
          <>
            {canEdit && (
              <ButtonLink to={paths.firm.editSite(site.id)} variant="secondary">
                <Pencil className="size-4" aria-hidden="true" /> Edit site
              </ButtonLink>
            )}
            {ability.can('create', 'Job') && (
              <NewJobButton site={{ id: site.id, name: site.name, timeZone: site.timeZone, clientName: site.clientName }} onCreated={(jobId) => void navigate(paths.firm.job(jobId))} />
            )}
          </>
        }
      />
      <div className="grid gap-6 lg:grid-cols-3">
        <div className="space-y-6 lg:col-span-2">
          <SiteCoverageCard siteId={site.id} />
          <SitePanels siteId={site.id} />
          <SiteDocuments siteId={site.id} timeZone={site.timeZone} canUpload={ability.can('create', 'Document')} canEdit={ability.can('update', 'Document')} />
          {ability.can('read', 'Job') && <ServiceHistoryCard siteId={site.id} timeZone={site.timeZone} />}
        </div>
        <div className="space-y-6">
          <Card title="Monitoring">
            <dl>
              <Row label="Account">{site.monitoringAccount ? <span className="font-mono">{site.monitoringAccount}</span> : '—'}</Row>
              <Row label="Verbal passcode">
                <PasscodeReveal siteId={site.id} hasPasscode={site.hasPasscode} canReveal={ability.can('reveal', 'Site')} />
              </Row>
              <Row label="Time zone">{site.timeZone.replace(/_/g, ' ')}</Row>
            </dl>
            {site.accessNotes && (
              <div className="mt-3 border-t border-line pt-3">
                <p className="text-xs font-semibold text-slate-500">Access notes (staff only)</p>
                <p className="mt-1 text-sm whitespace-pre-line">{site.accessNotes}</p>
              </div>
            )}
          </Card>
          <EmergencyContacts siteId={site.id} canEdit={ability.can('update', 'Contact')} timeZone={site.timeZone} />
          <Card title="Permit and contract">
            <dl>
              <Row label="Alarm permit">
                {site.permit.number ? (
                  <span className="font-mono">{site.permit.number}</span>
                ) : (
                  <span className="text-slate-500">Not recorded</span>
                )}
                {site.permit.authority && <span className="block text-xs text-slate-500">{site.permit.authority}</span>}
              </Row>
              <Row label="Permit expires">
                {site.permit.expiresOn ? (
                  <span className="inline-flex flex-wrap items-center gap-2">
                    {formatDate(site.permit.expiresOn, 'UTC')}
                    {permit === 'past' && <Badge tone="bad">Expired</Badge>}
                    {permit === 'soon' && <Badge tone="warn">Renew soon</Badge>}
                  </span>
                ) : (
                  '—'
                )}
              </Row>
              {site.contract && (
                <>
                  <Row label="Contract">
                    {site.contract.startsOn ? `From ${formatDate(site.contract.startsOn, 'UTC')}` : 'No contract recorded'}
                    {site.contract.termMonths ? `, ${site.contract.termMonths} months` : ''}
                    {contractEnd && <span className="block text-xs text-slate-500">Term ends {formatDate(contractEnd, 'UTC')}</span>}
                  </Row>
                  <Row label="Monthly fee">{site.contract.monthlyFeeCents !== null ? formatCents(site.contract.monthlyFeeCents) : '—'}</Row>
                  {site.contract.cancelledOn && (
                    <Row label="Cancelled">
                      <Badge tone="bad">Cancelled {formatDate(site.contract.cancelledOn, 'UTC')}</Badge>
                      {site.contract.cancelReason && <span className="mt-1 block text-xs text-slate-500">{site.contract.cancelReason}</span>}
                    </Row>
                  )}
                </>
              )}
            </dl>
          </Card>
        </div>
      </div>
    </>
  );
}
