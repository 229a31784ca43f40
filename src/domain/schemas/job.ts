import { z } from 'zod';
import { JOB_KINDS, JOB_STATES, WALK_TEST_RESULTS } from '../jobs';
import { listQuery, optionalText, patchOf, uuid } from './common';

const instant = z.iso.datetime({ offset: true, error: 'Give a date and time, like 2026-12-03T09:00:00Z.' });

export const partSchema = z.object({
  description: z.string({ error: 'Describe the part.' }).trim().min(1, 'Describe the part.').max(120, 'Use at most 120 characters.'),
  quantity: z.number({ error: 'Quantity is a number.' }).int('Use a whole number.').min(1, 'At least 1.').max(999, 'At most 999.'),
  unitPriceCents: z.number({ error: 'Unit price is in cents.' }).int('Use whole cents.').min(0, 'Cannot be negative.').max(10_000_000, 'That price is too large.'),
});

export const checklistItemSchema = z.object({
  label: z.string({ error: 'Write the checklist item.' }).trim().min(1, 'Write the checklist item.').max(200, 'Use at most 200 characters.'),
  done: z.boolean({ error: 'done is true or false.' }).default(false),
});

const jobFields = z.object({
  siteId: uuid,
  kind: z.enum(JOB_KINDS, { error: 'Choose the kind of job.' }),
  scheduledStart: instant.nullable().default(null),
  scheduledEnd: instant.nullable().default(null),
  technicianId: uuid.nullable().default(null),
  summary: z.string({ error: 'Say what the job is about.' }).trim().min(1, 'Say what the job is about, like “Replace back-door contact”.').max(200, 'Use at most 200 characters.'),
  clientNotes: optionalText(4000).default(''),
  internalNotes: optionalText(4000).default(''),
  parts: z.array(partSchema).max(100, 'At most 100 parts.').default([]),
  /** omitted on create: the firm's checklist for the job kind */
  checklist: z.array(checklistItemSchema).max(50, 'At most 50 checklist items.').optional(),
  touchedZoneIds: z.array(uuid).max(999).default([]),
});

function endAfterStart(v: { scheduledStart?: string | null | undefined; scheduledEnd?: string | null | undefined }, ctx: z.RefinementCtx) {
  if (v.scheduledStart && v.scheduledEnd && new Date(v.scheduledEnd) <= new Date(v.scheduledStart))
    ctx.addIssue({ code: 'custom', path: ['scheduledEnd'], message: 'The end must come after the start.' });
}

export const jobCreateSchema = jobFields.superRefine(endAfterStart);
export type JobCreateInput = z.input<typeof jobCreateSchema>;
export const jobPatchSchema = patchOf(jobFields.omit({ siteId: true })).superRefine(endAfterStart);

export const jobTransitionSchema = z.object({
  to: z.enum(JOB_STATES, { error: 'Choose the state to move to.' }),
  cancelReason: optionalText(500).optional(),
  /** battery changes and service calls, on completion: zones whose battery was changed */
  batteryChangedZoneIds: z.array(uuid).max(999, 'At most 999 zones.').optional(),
});

export const walkTestSchema = z
  .array(
    z.object({
      zoneId: uuid,
      result: z.enum(WALK_TEST_RESULTS, { error: 'Choose passed, failed or not tested.' }),
      monitoringConfirmed: z.boolean({ error: 'Monitoring center confirmed is yes or no.' }).default(false),
      note: optionalText(500).default(''),
    }),
  )
  .max(999)
  .superRefine((rows, ctx) => {
    rows.forEach((r, i) => {
      if (r.result === 'failed' && !r.note) ctx.addIssue({ code: 'custom', path: [i, 'note'], message: 'Say what failed, so the next visit knows.' });
    });
  });

export const jobListQuery = listQuery.extend({
  state: z.enum(JOB_STATES, { error: 'Not a job state.' }).optional(),
  kind: z.enum(JOB_KINDS, { error: 'Not a job kind.' }).optional(),
  technicianId: uuid.optional(),
  siteId: uuid.optional(),
  from: instant.optional(),
  to: instant.optional(),
});

/** The firm's checklist per job kind (firm settings); a kind left out uses our default. */
export const checklistTemplatesSchema = z.partialRecord(
  z.enum(JOB_KINDS),
  z
    .array(z.string({ error: 'Write the checklist item.' }).trim().min(1, 'Write the checklist item, or remove the line.').max(200, 'Use at most 200 characters.'))
    .max(50, 'At most 50 items per checklist.'),
);
export type ChecklistTemplates = z.infer<typeof checklistTemplatesSchema>;
