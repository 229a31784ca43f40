import { useQuery } from '@tanstack/react-query';
import { useParams } from 'react-router-dom';
import { useSession } from '@/lib/auth';
import { EmergencyContactsEditor } from '@/features/sites/components/emergency-contacts';
import { portalContactsQuery, useSavePortalContacts } from '@/features/portal/api/portal-queries';
import { PortalTitle } from '@/features/portal/components/portal-parts';

/** The people the monitoring center calls, in order; the household keeps the list current. */
export default function PortalContactsPage() {
  const { siteId = '' } = useParams();
  const { tenant } = useSession();
  const contacts = useQuery(portalContactsQuery(siteId));
  const save = useSavePortalContacts(siteId);
  const firmName = tenant?.name ?? 'Your alarm firm';
  return (
    <div className="max-w-2xl">
      <PortalTitle title="Emergency contacts" context="When the alarm goes off, the monitoring center calls these people in this order." />
      <EmergencyContactsEditor
        contacts={contacts}
        replace={save}
        canEdit
        savedMessage={`Contacts saved. ${firmName} will confirm the change with the monitoring center.`}
        note={
          <p className="mb-4 rounded-md border border-line bg-paper px-3 py-2 text-sm text-slate-500">
            Changes you save here go to {firmName}, who confirms them with the monitoring center. Until they do, the center may still call the people on the previous list.
          </p>
        }
      />
    </div>
  );
}
