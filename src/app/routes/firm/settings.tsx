import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { firmQuery } from '@/features/firm/api/firm-queries';
import { FirmSettingsForm } from '@/features/firm/components/firm-settings-form';
import { LogoUpload } from '@/features/firm/components/logo-upload';
import { UpkeepSettingsForm } from '@/features/firm/components/upkeep-settings-form';
import { ChecklistTemplatesForm } from '@/features/firm/components/checklist-templates-form';

export function loader(queryClient: QueryClient) {
  return queryClient.ensureQueryData(firmQuery());
}

export default function FirmSettingsPage() {
  const { data: firm } = useSuspenseQuery(firmQuery());
  return (
    <>
      <PageHeader title="Firm settings" context="How your firm appears to staff, on documents and in your clients’ portal." />
      <div className="space-y-6">
        <Card title="Logo">
          <LogoUpload firm={firm} />
        </Card>
        <FirmSettingsForm key={firm.id} firm={firm} />
        <UpkeepSettingsForm canEdit />
        <ChecklistTemplatesForm />
      </div>
    </>
  );
}
