import { useId, useState, type ReactNode } from 'react';
import { useQuery, type UseMutationResult, type UseQueryResult } from '@tanstack/react-query';
import { ArrowDown, ArrowUp, ChevronDown, ChevronRight, Pencil, Plus, Trash2 } from 'lucide-react';
import { formatPhone } from '@domain/phone';
import { ROLE_LABELS, ROLES } from '@domain/roles';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { formatDateTime } from '@/lib/format';
import type { ApiContact, ApiContactChange } from '@/types/api';
import { contactChangesQuery, contactsQuery, useReplaceContacts } from '../api/sites-queries';

/** One contact as the list is saved: the order of the list is the calling order. */
export type ContactRow = Omit<ApiContact, 'id' | 'siteId' | 'position'>;

interface Draft {
  key: number;
  name: string;
  relation: string;
  phone: string;
  altPhone: string;
}

let nextKey = 1;

/**
 * The ordered list the monitoring center calls: first is called first. Edited as a whole.
 * Staff also see who changed the list and what changed (the portal does not).
 */
export function EmergencyContacts({ siteId, canEdit, timeZone }: { siteId: string; canEdit: boolean; timeZone?: string }) {
  const contacts = useQuery(contactsQuery(siteId));
  const replace = useReplaceContacts(siteId);
  return <EmergencyContactsEditor contacts={contacts} replace={replace} canEdit={canEdit} footer={<ContactChanges siteId={siteId} timeZone={timeZone} />} />;
}

function actorOf(change: ApiContactChange): string {
  if (!change.actor) return change.byHousehold ? 'The household' : 'Someone no longer with the firm';
  if (change.byHousehold) return `${change.actor.name} (the household)`;
  const role = ROLES.find((r) => r === change.actor?.role);
  return `${change.actor.name} (${role ? ROLE_LABELS[role] : change.actor.role})`;
}

/** The history of the list, newest first, folded away until asked for. */
function ContactChanges({ siteId, timeZone }: { siteId: string; timeZone?: string | undefined }) {
  const changes = useQuery(contactChangesQuery(siteId));
  const [open, setOpen] = useState(false);
  const listId = useId();
  return (
    <section aria-label="Changes" className="mt-4 border-t border-line pt-3">
      {changes.isPending ? (
        <Skeleton className="h-6 w-40" />
      ) : changes.isError ? (
        <p className="text-sm text-clay-600">{changes.error.message}</p>
      ) : changes.data.length === 0 ? (
        <p className="text-sm text-slate-500">No changes recorded yet.</p>
      ) : (
        <>
          <Button variant="ghost" size="sm" className="-ml-2 px-2" aria-expanded={open} aria-controls={listId} onClick={() => setOpen((o) => !o)}>
            {open ? <ChevronDown className="size-4" aria-hidden="true" /> : <ChevronRight className="size-4" aria-hidden="true" />}
            {open ? 'Hide changes' : `Show changes (${changes.data.length})`}
          </Button>
          {open && (
            <ol id={listId} aria-label="Changes to the emergency contacts" className="mt-2 space-y-3 text-sm">
              {changes.data.map((change) => (
                <li key={change.id} className="border-l-2 border-line pl-3">
                  <p className="text-xs text-slate-500">
                    {formatDateTime(change.at, timeZone)} · {actorOf(change)}
                  </p>
                  <p className="mt-0.5">{change.summary}</p>
                  {change.byHousehold && (
                    <Badge tone="warn" className="mt-1 whitespace-normal!">
                      By the household — confirm with the monitoring center
                    </Badge>
                  )}
                </li>
              ))}
            </ol>
          )}
        </>
      )}
    </section>
  );
}

/** The list and its editor, for any source (the staff site page, the household's portal). */
export function EmergencyContactsEditor({
  contacts,
  replace,
  canEdit,
  note,
  footer,
  savedMessage = 'Emergency contacts saved.',
}: {
  contacts: UseQueryResult<ApiContact[]>;
  replace: UseMutationResult<ApiContact[], Error, ContactRow[]>;
  canEdit: boolean;
  /** shown above the list (the portal says who confirms changes) */
  note?: ReactNode;
  /** shown below the list (staff see the list's changes) */
  footer?: ReactNode;
  savedMessage?: string;
}) {
  const toast = useToast();
  const [drafts, setDrafts] = useState<Draft[] | null>(null);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [formError, setFormError] = useState<string | null>(null);

  const startEditing = () => {
    setErrors({});
    setFormError(null);
    setDrafts((contacts.data ?? []).map((c) => ({ key: nextKey++, name: c.name, relation: c.relation, phone: formatPhone(c.phone), altPhone: formatPhone(c.altPhone) })));
  };
  const update = (index: number, patch: Partial<Draft>) => setDrafts((d) => d && d.map((row, i) => (i === index ? { ...row, ...patch } : row)));
  const move = (index: number, by: -1 | 1) =>
    setDrafts((d) => {
      if (!d) return d;
      const next = [...d];
      const [row] = next.splice(index, 1);
      next.splice(index + by, 0, row!);
      return next;
    });
  const save = () => {
    if (!drafts) return;
    setErrors({});
    setFormError(null);
    replace.mutate(
      drafts.map(({ name, relation, phone, altPhone }) => ({ name, relation, phone, altPhone })),
      {
        onSuccess: () => {
          toast.success(savedMessage);
          setDrafts(null);
        },
        onError: (err) => {
          if (err instanceof ApiError) {
            setErrors(err.fields);
            setFormError(err.message);
          } else setFormError('Something went wrong. Try again.');
        },
      },
    );
  };
  const fieldError = (i: number, field: string) => errors[`contacts.${i}.${field}`];

  return (
    <Card
      title="Emergency contacts"
      action={
        canEdit &&
        !drafts && (
          <Button variant="ghost" size="sm" onClick={startEditing}>
            <Pencil className="size-4" aria-hidden="true" /> Edit
          </Button>
        )
      }
    >
      {note}
      {contacts.isPending ? (
        <Skeleton className="h-16 w-full" />
      ) : contacts.isError ? (
        <p className="text-sm text-clay-600">{contacts.error.message}</p>
      ) : drafts ? (
        <div className="space-y-3">
          <FormError message={formError} />
          <ol className="space-y-3">
            {drafts.map((row, i) => (
              <li key={row.key} className="rounded-md border border-line p-3">
                <div className="mb-2 flex items-center justify-between">
                  <span className="text-xs font-semibold text-slate-500">
                    Contact {i + 1}
                    {i === 0 ? ' · called first' : ''}
                  </span>
                  <span className="flex gap-1">
                    <Button variant="ghost" size="sm" className="px-2" disabled={i === 0} onClick={() => move(i, -1)} aria-label={`Move ${row.name || 'contact'} up`}>
                      <ArrowUp className="size-4" aria-hidden="true" />
                    </Button>
                    <Button variant="ghost" size="sm" className="px-2" disabled={i === drafts.length - 1} onClick={() => move(i, 1)} aria-label={`Move ${row.name || 'contact'} down`}>
                      <ArrowDown className="size-4" aria-hidden="true" />
                    </Button>
                    <Button variant="ghost" size="sm" className="px-2" onClick={() => setDrafts(drafts.filter((_, j) => j !== i))} aria-label={`Remove ${row.name || 'contact'}`}>
                      <Trash2 className="size-4" aria-hidden="true" />
                    </Button>
                  </span>
                </div>
                <div className="grid gap-2 sm:grid-cols-2">
                  {(
                    [
                      ['name', 'Name', 'text'],
                      ['relation', 'Relation', 'text'],
                      ['phone', 'Phone', 'tel'],
                      ['altPhone', 'Other phone', 'tel'],
                    ] as const
                  ).map(([field, label, type]) => (
                    <div key={field}>
                      <label className="mb-1 block text-xs font-medium" htmlFor={`contact-${row.key}-${field}`}>
                        {label}
                      </label>
                      <Input
                        id={`contact-${row.key}-${field}`}
                        type={type}
                        value={row[field]}
                        invalid={!!fieldError(i, field)}
                        onChange={(e) => update(i, { [field]: e.target.value })}
                      />
                      {fieldError(i, field) && <p className="mt-1 text-xs text-clay-600">{fieldError(i, field)}</p>}
                    </div>
                  ))}
                </div>
              </li>
            ))}
          </ol>
          <div className="flex flex-wrap justify-between gap-2">
            <Button variant="secondary" size="sm" onClick={() => setDrafts([...drafts, { key: nextKey++, name: '', relation: '', phone: '', altPhone: '' }])}>
              <Plus className="size-4" aria-hidden="true" /> Add contact
            </Button>
            <span className="flex gap-2">
              <Button variant="ghost" size="sm" onClick={() => setDrafts(null)}>
                Cancel
              </Button>
              <Button size="sm" busy={replace.isPending} onClick={save}>
                Save contacts
              </Button>
            </span>
          </div>
        </div>
      ) : contacts.data.length === 0 ? (
        <p className="text-sm text-slate-500">No emergency contacts yet. The monitoring center needs at least one person to call.</p>
      ) : (
        <ol className="space-y-2 text-sm">
          {contacts.data.map((c) => (
            <li key={c.id} className="flex gap-3">
              <span className="flex size-6 shrink-0 items-center justify-center rounded-md bg-slate-100 text-xs font-semibold tabular-nums">{c.position}</span>
              <span className="min-w-0">
                <span className="font-medium">{c.name}</span>
                {c.relation && <span className="text-slate-500"> · {c.relation}</span>}
                <span className="block">
                  <a href={`tel:${c.phone}`} className="text-brass-700 underline">
                    {formatPhone(c.phone)}
                  </a>
                  {c.altPhone && (
                    <>
                      {' · '}
                      <a href={`tel:${c.altPhone}`} className="text-brass-700 underline">
                        {formatPhone(c.altPhone)}
                      </a>
                    </>
                  )}
                </span>
              </span>
            </li>
          ))}
        </ol>
      )}
      {footer}
    </Card>
  );
}
