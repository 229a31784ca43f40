import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { ArrowLeft } from 'lucide-react';
import { paths } from '@/config/paths';
import { PageHeader } from '@/components/ui/page-header';
import { useToast } from '@/components/ui/toast';
import { useSession } from '@/lib/auth';
import { clientQuery } from '@/features/clients/api/clients-queries';
import { useCreateSite } from '@/features/sites/api/sites-queries';
import { SiteForm } from '@/features/sites/components/site-form';

export function loader(queryClient: QueryClient, { params }: LoaderFunctionArgs) {
  return queryClient.ensureQueryData(clientQuery(params.clientId ?? ''));
}

export default function NewSitePage() {
  const { clientId = '' } = useParams();
  const { data: client } = useSuspenseQuery(clientQuery(clientId));
  const { tenant } = useSession();
  const create = useCreateSite();
  const navigate = useNavigate();
  const toast = useToast();
  return (
    <>
      <Link to={paths.firm.client(clientId)} className="mb-4 inline-flex items-center gap-1 text-sm text-slate-500 hover:text-ink">
        <ArrowLeft className="size-4" aria-hidden="true" /> {client.name}
      </Link>
      <PageHeader title="New site" context={`A protected place of ${client.name}. Panels and zones come next.`} />
      <SiteForm
        clientId={clientId}
        defaultTimeZone={tenant?.timeZone ?? 'UTC'}
        busy={create.isPending}
        submitLabel="Add site"
        onCancel={() => void navigate(paths.firm.client(clientId))}
        onSubmit={(values, { fail }) =>
          create.mutate(values, {
            onSuccess: (site) => {
              toast.success(`${site.name} added.`);
              void navigate(paths.firm.site(site.id));
            },
            onError: fail,
          })
        }
      />
    </>
  );
}
