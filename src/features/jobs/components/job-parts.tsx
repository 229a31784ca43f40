import { useState } from 'react';
import { Controller, useFieldArray, useForm, useWatch, type Control } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Plus, Trash2 } from 'lucide-react';
import { formatCents } from '@domain/plans';
import { partSchema } from '@domain/schemas/job';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { MoneyInput } from '@/components/ui/money-input';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiJob } from '@/types/api';
import { useUpdateJob } from '../api/jobs-queries';
import { partsTotalCents } from './job-bits';

const partsForm = z.object({
  parts: z.array(
    partSchema.extend({
      quantity: z.number({ error: 'Give a quantity.' }).int('Use a whole number.').min(1, 'At least 1.').max(999, 'At most 999.'),
      unitPriceCents: z
        .number({ error: 'Give a price (0 for none).' })
        .int('Use whole cents.')
        .min(0, 'Cannot be negative.')
        .max(10_000_000, 'That price is too large.'),
    }),
  ),
});
type PartsValues = { parts: { description: string; quantity: number; unitPriceCents: number | null }[] };

/** A unit price in dollars on screen, cents in the form (FormField gives it its id and error state). */
function PriceField({
  control,
  index,
  id,
  invalid,
  'aria-describedby': describedBy,
}: {
  control: Control<PartsValues>;
  index: number;
  id?: string;
  invalid?: boolean;
  'aria-describedby'?: string;
}) {
  return (
    <Controller
      control={control}
      name={`parts.${index}.unitPriceCents`}
      render={({ field }) => (
        <MoneyInput id={id} invalid={invalid} aria-describedby={describedBy} value={field.value} onChange={field.onChange} onBlur={field.onBlur} />
      )}
    />
  );
}

/** Parts used on the job: description, quantity and unit price (cents), with the total. */
export function JobParts({ job, editable }: { job: ApiJob; editable: boolean }) {
  const update = useUpdateJob(job.id);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, register, handleSubmit, formState, reset } = useForm<PartsValues>({
    resolver: zodResolver(partsForm) as never,
    values: { parts: job.parts.map((p) => ({ ...p })) },
    resetOptions: { keepDirtyValues: true },
  });
  const { fields, append, remove } = useFieldArray({ control, name: 'parts' });
  const watched = useWatch({ control, name: 'parts' }) ?? [];
  const total = partsTotalCents(watched);
  const onSubmit = handleSubmit((v) => {
    setFormError(null);
    const parts = v.parts.map((p) => ({ description: p.description.trim(), quantity: p.quantity, unitPriceCents: p.unitPriceCents ?? 0 }));
    update.mutate(
      { parts },
      {
        onSuccess: (saved) => {
          reset({ parts: saved.parts.map((p) => ({ ...p })) });
          toast.success('Parts saved.');
        },
        onError: (err) => setFormError(err instanceof ApiError ? err.message : 'Something went wrong. Try again.'),
      },
    );
  });
  const errs = formState.errors.parts;

  if (!editable && job.parts.length === 0) {
    return (
      <Card title="Parts">
        <p className="text-sm text-slate-500">No parts recorded.</p>
      </Card>
    );
  }

  return (
    <Card title="Parts">
      <form onSubmit={onSubmit} noValidate className="space-y-3">
        <FormError message={formError} />
        {fields.length === 0 && <p className="text-sm text-slate-500">No parts yet. Add each device, battery or cable you fit.</p>}
        <ul className="space-y-3">
          {fields.map((field, i) => {
            const row = watched[i];
            const line = (row?.quantity ?? 0) * (row?.unitPriceCents ?? 0);
            return (
              <li key={field.id} className="rounded-md border border-line p-3">
                <fieldset className="grid grid-cols-[4.5rem_1fr_auto] items-start gap-2" disabled={!editable}>
                  <legend className="sr-only">Part {i + 1}</legend>
                  <FormField label="Description" className="col-span-3" error={errs?.[i]?.description?.message}>
                    <Input autoComplete="off" placeholder="Like “Door contact, white”" {...register(`parts.${i}.description`)} />
                  </FormField>
                  <FormField label="Qty" error={errs?.[i]?.quantity?.message}>
                    <Input
                      type="number"
                      inputMode="numeric"
                      min={1}
                      max={999}
                      className="tabular-nums"
                      {...register(`parts.${i}.quantity`, { valueAsNumber: true })}
                    />
                  </FormField>
                  <FormField label="Unit price" error={errs?.[i]?.unitPriceCents?.message}>
                    <PriceField control={control} index={i} />
                  </FormField>
                  <div className="pt-6 text-right">
                    {editable ? (
                      <Button variant="ghost" size="md" className="px-2.5" aria-label={`Remove part ${i + 1}`} onClick={() => remove(i)}>
                        <Trash2 className="size-4" aria-hidden="true" />
                      </Button>
                    ) : null}
                  </div>
                  <p className="col-span-3 text-right text-xs text-slate-500 tabular-nums">Line total {formatCents(line)}</p>
                </fieldset>
              </li>
            );
          })}
        </ul>
        <div className="flex items-center justify-between gap-2 border-t border-line pt-3">
          <span className="text-sm">
            Total <span className="font-semibold tabular-nums">{formatCents(total)}</span>
          </span>
          {editable && (
            <span className="flex gap-2">
              <Button variant="secondary" size="sm" onClick={() => append({ description: '', quantity: 1, unitPriceCents: null })}>
                <Plus className="size-4" aria-hidden="true" /> Add part
              </Button>
              <Button type="submit" size="sm" busy={update.isPending} disabled={!formState.isDirty}>
                Save parts
              </Button>
            </span>
          )}
        </div>
      </form>
    </Card>
  );
}
