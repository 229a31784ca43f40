/**
 * The inline forms of the premises page: add or edit a floor, a room, an opening. Built for
 * the keyboard: Enter submits from any field (checkboxes and selects too), Escape cancels an
 * edit, and Enter on an empty add form moves on to the next natural place.
 */
import { cloneElement, useId, useState, type KeyboardEvent, type ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import { Check, Plus, X } from 'lucide-react';
import { canServeSleepingArea } from '@domain/coverage';
import { OPENING_KIND_LABELS, OPENING_KINDS, ROOM_KIND_LABELS, ROOM_KINDS, type RoomKind } from '@domain/premises';
import { uuid } from '@domain/schemas/common';
import { floorSchema, openingSchema, roomSchema } from '@domain/schemas/premises';
import { Button } from '@/components/ui/button';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { cn } from '@/lib/cn';
import { applyServerErrors } from '@/lib/form-errors';
import { guessOpeningKind, guessRoomKind } from '../guess';
import { IconButton } from './icon-button';

type FloorFormInput = z.input<typeof floorSchema>;
type FloorFormValues = z.output<typeof floorSchema>;
/** The hall and bedroom selects: an empty choice is no link. */
const roomLink = z.preprocess((v) => (v === '' || v === undefined ? null : v), uuid.nullable());
/** The room form: the schema, with the links chosen from selects. */
const roomFormSchema = roomSchema.extend({ servedByHallId: roomLink, attachedToBedroomId: roomLink });
type RoomFormInput = z.input<typeof roomFormSchema>;
type RoomFormValues = z.output<typeof roomFormSchema>;

/** A room of the site as the hall and bedroom selects offer it. */
export interface SiteRoomOption {
  id: string;
  name: string;
  kind: RoomKind;
  floorId: string;
  floorName: string;
}
type OpeningFormInput = z.input<typeof openingSchema>;
type OpeningFormValues = z.output<typeof openingSchema>;

/** Both refs on one element: react-hook-form's and the focus registry's. */
function bothRefs<T>(a: (el: T | null) => void, b: ((el: T | null) => void) | undefined) {
  return (el: T | null) => {
    a(el);
    b?.(el);
  };
}

/** Enter in a checkbox or a select submits the form too (browsers only do it for text fields). */
function submitOnEnter(e: KeyboardEvent<HTMLFormElement>, onEscape?: () => void) {
  const target = e.target as HTMLElement;
  if (e.key === 'Escape' && onEscape) {
    e.preventDefault();
    e.stopPropagation();
    onEscape();
    return;
  }
  if (e.key !== 'Enter' || e.shiftKey || e.altKey || e.ctrlKey || e.metaKey) return;
  const isCheck = target instanceof HTMLInputElement && target.type === 'checkbox';
  if (isCheck || target instanceof HTMLSelectElement) {
    e.preventDefault();
    e.currentTarget.requestSubmit();
  }
}

function CheckBox({ label, className, error, ...rest }: React.InputHTMLAttributes<HTMLInputElement> & { label: string; error?: string | undefined }) {
  const id = useId();
  const errorId = error ? `${id}-error` : undefined;
  return (
    <div className={className}>
      <div className="flex min-h-10 items-center gap-2">
        <input id={id} type="checkbox" className="size-4 shrink-0 accent-brass-600" aria-invalid={error ? true : undefined} aria-describedby={errorId} {...rest} />
        <label htmlFor={id} className={cn('text-sm leading-tight', rest.disabled ? 'text-slate-500' : 'text-ink')}>
          {label}
        </label>
      </div>
      {error && (
        <p id={errorId} className="text-xs font-medium text-clay-600" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** Rooms grouped by floor as <optgroup>s, in the order given. */
function RoomOptions({ rooms }: { rooms: readonly SiteRoomOption[] }) {
  const floors: { id: string; name: string; rooms: SiteRoomOption[] }[] = [];
  for (const room of rooms) {
    const floor = floors.find((f) => f.id === room.floorId);
    if (floor) floor.rooms.push(room);
    else floors.push({ id: room.floorId, name: room.floorName, rooms: [room] });
  }
  return (
    <>
      {floors.map((f) => (
        <optgroup key={f.id} label={f.name}>
          {f.rooms.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </optgroup>
      ))}
    </>
  );
}

/** A labelled control; in a compact line the label is for screen readers only (the placeholder shows what goes there). */
function Field({
  label,
  error,
  compact,
  className,
  children,
}: {
  label: string;
  error?: string | undefined;
  compact?: boolean;
  className?: string;
  children: React.ReactElement<{ id?: string; 'aria-describedby'?: string; invalid?: boolean }>;
}) {
  if (!compact)
    return (
      <FormField label={label} error={error} className={className}>
        {children}
      </FormField>
    );
  return (
    <CompactField label={label} error={error} className={className}>
      {children}
    </CompactField>
  );
}

function CompactField({
  label,
  error,
  className,
  children,
}: {
  label: string;
  error?: string | undefined;
  className?: string;
  children: React.ReactElement<{ id?: string; 'aria-describedby'?: string; invalid?: boolean }>;
}) {
  const id = useId();
  const errorId = error ? `${id}-error` : undefined;
  return (
    <div className={className}>
      <label htmlFor={id} className="sr-only">
        {label}
      </label>
      {cloneElement(children, { id, 'aria-describedby': errorId, invalid: !!error })}
      {error && (
        <p id={errorId} className="mt-1 text-xs font-medium text-clay-600" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

function Actions({ mode, busy, addLabel, onCancel }: { mode: 'add' | 'edit'; busy: boolean; addLabel: string; onCancel?: (() => void) | undefined }) {
  if (mode === 'add')
    return (
      <div className="flex shrink-0 gap-1">
        <Button type="submit" variant="secondary" busy={busy}>
          <Plus className="size-4" aria-hidden="true" /> {addLabel}
        </Button>
        {onCancel && (
          <IconButton label="Close (Escape)" className="size-10 sm:size-10" onClick={onCancel}>
            <X className="size-4" aria-hidden="true" />
          </IconButton>
        )}
      </div>
    );
  return (
    <div className="flex shrink-0 gap-2">
      <Button type="submit" busy={busy}>
        <Check className="size-4" aria-hidden="true" /> Save
      </Button>
      <Button variant="ghost" onClick={onCancel}>
        <X className="size-4" aria-hidden="true" /> Cancel
      </Button>
    </div>
  );
}

interface FormShellProps {
  label: string;
  onSubmit: (e: React.FormEvent<HTMLFormElement>) => void;
  onEscape?: (() => void) | undefined;
  error: string | null;
  hint?: ReactNode;
  className?: string;
  children: ReactNode;
}

function FormShell({ label, onSubmit, onEscape, error, hint, className, children }: FormShellProps) {
  return (
    <form aria-label={label} noValidate onSubmit={onSubmit} onKeyDown={(e) => submitOnEnter(e, onEscape)} className={cn('space-y-2', className)}>
      <FormError message={error} />
      {children}
      {hint && <p className="text-xs text-slate-500">{hint}</p>}
    </form>
  );
}

// ---------------------------------------------------------------------------------------------
// Floor
// ---------------------------------------------------------------------------------------------

interface FloorFormProps {
  mode: 'add' | 'edit';
  label: string;
  initial: FloorFormInput;
  onSave: (values: FloorFormValues) => Promise<unknown>;
  onCancel?: () => void;
  focusRef?: (el: HTMLElement | null) => void;
  hint?: ReactNode;
  autoFocus?: boolean;
}

const FLOOR_FIELDS = ['name', 'level', 'belowGrade'] as const;

export function FloorForm({ mode, label, initial, onSave, onCancel, focusRef, hint, autoFocus }: FloorFormProps) {
  const [formError, setFormError] = useState<string | null>(null);
  const [gradeByHand, setGradeByHand] = useState(mode === 'edit');
  const { register, handleSubmit, setError, setValue, reset, formState } = useForm<FloorFormInput, unknown, FloorFormValues>({
    resolver: zodResolver(floorSchema),
    defaultValues: initial,
  });
  const e = formState.errors;
  const name = register('name');
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSave(values);
      if (mode === 'add') {
        reset({ name: '', level: values.level + 1, belowGrade: false });
        setGradeByHand(false);
      }
    } catch (err) {
      setFormError(applyServerErrors(err, setError, FLOOR_FIELDS));
    }
  });
  return (
    <FormShell label={label} onSubmit={submit} onEscape={onCancel} error={formError} hint={hint}>
      <div className="grid grid-cols-[minmax(0,1fr)_5.5rem] gap-x-3 gap-y-2 sm:grid-cols-[minmax(0,1fr)_5.5rem_auto_auto] sm:items-start">
        <FormField label="Floor name" error={e.name?.message}>
          <Input autoComplete="off" placeholder="Like “Ground floor”" autoFocus={autoFocus} {...name} ref={bothRefs(name.ref, focusRef)} />
        </FormField>
        <FormField label="Level" error={e.level?.message}>
          <Input
            type="number"
            inputMode="numeric"
            className="tabular-nums"
            {...register('level', {
              valueAsNumber: true,
              onChange: (ev: React.ChangeEvent<HTMLInputElement>) => {
                if (!gradeByHand) setValue('belowGrade', Number(ev.target.value) < 0);
              },
            })}
          />
        </FormField>
        <CheckBox label="Below grade" className="sm:mt-6" {...register('belowGrade', { onChange: () => setGradeByHand(true) })} />
        <div className="col-span-2 flex justify-end sm:col-span-1 sm:mt-6">
          <Actions mode={mode} busy={formState.isSubmitting} addLabel="Add floor" onCancel={onCancel} />
        </div>
      </div>
    </FormShell>
  );
}

// ---------------------------------------------------------------------------------------------
// Room
// ---------------------------------------------------------------------------------------------

interface RoomFormProps {
  mode: 'add' | 'edit';
  label: string;
  initial: RoomFormInput;
  onSave: (values: RoomFormValues) => Promise<unknown>;
  onCancel?: () => void;
  /** Enter on an empty add form: move on (to the next floor) */
  onEmpty?: () => void;
  focusRef?: (el: HTMLElement | null) => void;
  hint?: ReactNode;
  autoFocus?: boolean;
  /** the site's rooms, for a bedroom's hall and a bathroom's bedroom */
  siteRooms?: readonly SiteRoomOption[];
  /** editing: the room itself, left out of the choices */
  roomId?: string;
}

const ROOM_FIELDS = ['name', 'kind', 'fuelBurningAppliance', 'attachedGarage', 'servedByHallId', 'hallWithin21FtConfirmed', 'attachedToBedroomId'] as const;

export function RoomForm({ mode, label, initial, onSave, onCancel, onEmpty, focusRef, hint, autoFocus, siteRooms = [], roomId }: RoomFormProps) {
  const [formError, setFormError] = useState<string | null>(null);
  const [kindByHand, setKindByHand] = useState(mode === 'edit');
  const { register, handleSubmit, setError, setValue, reset, watch, getValues, formState } = useForm<RoomFormInput, unknown, RoomFormValues>({
    resolver: zodResolver(roomFormSchema),
    defaultValues: initial,
  });
  const e = formState.errors;
  const kind = watch('kind');
  const hall = watch('servedByHallId');
  const hallChosen = typeof hall === 'string' && hall !== '';
  const others = siteRooms.filter((r) => r.id !== roomId);
  const halls = others.filter((r) => canServeSleepingArea(r.kind));
  const bedrooms = others.filter((r) => r.kind === 'bedroom');
  const name = register('name', {
    onChange: (ev: React.ChangeEvent<HTMLInputElement>) => {
      if (kindByHand) return;
      const guess = guessRoomKind(ev.target.value);
      if (guess) setValue('kind', guess);
    },
  });
  const save = handleSubmit(async (values) => {
    setFormError(null);
    try {
      // The links belong to one kind of room each: a bedroom's hall, a bathroom's bedroom.
      const bedroom = values.kind === 'bedroom';
      const servedByHallId = bedroom ? values.servedByHallId : null;
      await onSave({
        ...values,
        attachedGarage: values.kind === 'garage' && values.attachedGarage,
        servedByHallId,
        hallWithin21FtConfirmed: servedByHallId !== null && values.hallWithin21FtConfirmed,
        attachedToBedroomId: values.kind === 'bath' ? values.attachedToBedroomId : null,
      });
      if (mode === 'add') {
        reset(initial);
        setKindByHand(false);
      }
    } catch (err) {
      setFormError(applyServerErrors(err, setError, ROOM_FIELDS));
    }
  });
  const submit = (ev: React.FormEvent<HTMLFormElement>) => {
    if (mode === 'add' && onEmpty && String(getValues('name') ?? '').trim() === '') {
      ev.preventDefault();
      onEmpty();
      return;
    }
    void save(ev);
  };
  return (
    <FormShell label={label} onSubmit={submit} onEscape={onCancel} error={formError} hint={hint}>
      <div className="grid grid-cols-2 gap-x-3 gap-y-2 sm:grid-cols-[minmax(0,1.3fr)_minmax(0,1fr)_auto] sm:items-start">
        <FormField label="Room name" error={e.name?.message} className="col-span-2 sm:col-span-1">
          <Input autoComplete="off" placeholder="Like “Main bedroom”" autoFocus={autoFocus} {...name} ref={bothRefs(name.ref, focusRef)} />
        </FormField>
        <FormField label="Kind of room" error={e.kind?.message} className="col-span-2 sm:col-span-1">
          <Select {...register('kind', { onChange: () => setKindByHand(true) })}>
            {ROOM_KINDS.map((k) => (
              <option key={k} value={k}>
                {ROOM_KIND_LABELS[k]}
              </option>
            ))}
          </Select>
        </FormField>
        <div className="col-span-2 flex flex-wrap items-center justify-between gap-x-4 gap-y-1 sm:col-span-1 sm:mt-6 sm:flex-nowrap">
          <div className="flex flex-wrap gap-x-4">
            <CheckBox label="Fuel-burning appliance" {...register('fuelBurningAppliance')} />
            {kind === 'garage' && <CheckBox label="Attached garage" {...register('attachedGarage')} />}
          </div>
          {/* with the sleeping-area or bedroom links below, the actions come after them */}
          {kind !== 'bedroom' && kind !== 'bath' && <Actions mode={mode} busy={formState.isSubmitting} addLabel="Add room" onCancel={onCancel} />}
        </div>
      </div>
      {kind === 'bedroom' && (
        <fieldset className="rounded-md border border-line bg-card px-3 pt-1 pb-2">
          <legend className="px-1 text-sm font-medium text-ink">Sleeping area</legend>
          <div className="grid gap-x-4 gap-y-1 sm:grid-cols-[minmax(0,16rem)_minmax(0,1fr)] sm:items-start">
            <FormField
              label="Hall or landing outside it"
              error={e.servedByHallId?.message}
              hint={halls.length === 0 ? 'Add the hall or landing outside the bedrooms as a room first.' : undefined}
            >
              <Select
                {...register('servedByHallId', {
                  onChange: (ev: React.ChangeEvent<HTMLSelectElement>) => {
                    if (ev.target.value === '') setValue('hallWithin21FtConfirmed', false);
                  },
                })}
              >
                <option value="">Not chosen yet</option>
                <RoomOptions rooms={halls} />
              </Select>
            </FormField>
            <CheckBox
              label="Door within 21 ft of that hall’s alarm (measured on site along the path of travel)"
              className="sm:mt-6"
              disabled={!hallChosen}
              error={e.hallWithin21FtConfirmed?.message}
              {...register('hallWithin21FtConfirmed')}
            />
          </div>
        </fieldset>
      )}
      {kind === 'bath' && (
        <div className="sm:max-w-80">
          <FormField
            label="Attached to bedroom"
            error={e.attachedToBedroomId?.message}
            hint={bedrooms.length === 0 ? 'No bedrooms recorded on this site yet.' : 'An en-suite bathroom: its bedroom.'}
          >
            <Select {...register('attachedToBedroomId')}>
              <option value="">Not attached to a bedroom</option>
              <RoomOptions rooms={bedrooms} />
            </Select>
          </FormField>
        </div>
      )}
      {(kind === 'bedroom' || kind === 'bath') && (
        <div className="flex justify-end">
          <Actions mode={mode} busy={formState.isSubmitting} addLabel="Add room" onCancel={onCancel} />
        </div>
      )}
    </FormShell>
  );
}

// ---------------------------------------------------------------------------------------------
// Opening
// ---------------------------------------------------------------------------------------------

interface OpeningFormProps {
  mode: 'add' | 'edit';
  label: string;
  initial: OpeningFormInput;
  onSave: (values: OpeningFormValues) => Promise<unknown>;
  onCancel?: () => void;
  /** Enter on an empty add form: move on (to the next room) */
  onEmpty?: () => void;
  focusRef?: (el: HTMLElement | null) => void;
  hint?: ReactNode;
  autoFocus?: boolean;
}

const OPENING_FIELDS = ['kind', 'label', 'groundReachable'] as const;

export function OpeningForm({ mode, label, initial, onSave, onCancel, onEmpty, focusRef, hint, autoFocus }: OpeningFormProps) {
  const [formError, setFormError] = useState<string | null>(null);
  const [kindByHand, setKindByHand] = useState(mode === 'edit');
  const { register, handleSubmit, setError, setValue, reset, getValues, setFocus, formState } = useForm<OpeningFormInput, unknown, OpeningFormValues>(
    {
      resolver: zodResolver(openingSchema),
      defaultValues: initial,
    },
  );
  const e = formState.errors;
  const labelField = register('label', {
    onChange: (ev: React.ChangeEvent<HTMLInputElement>) => {
      if (kindByHand) return;
      const guess = guessOpeningKind(ev.target.value);
      if (guess) setValue('kind', guess);
    },
  });
  const save = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await onSave(values);
      if (mode === 'add') {
        // The kind and "reachable from the ground" stay as they were: the next window is likely like this one.
        reset({ label: '', kind: values.kind, groundReachable: values.groundReachable });
        setKindByHand(false);
        setFocus('label');
      }
    } catch (err) {
      setFormError(applyServerErrors(err, setError, OPENING_FIELDS));
    }
  });
  const submit = (ev: React.FormEvent<HTMLFormElement>) => {
    if (mode === 'add' && onEmpty && String(getValues('label') ?? '').trim() === '') {
      ev.preventDefault();
      onEmpty();
      return;
    }
    void save(ev);
  };
  return (
    <FormShell label={label} onSubmit={submit} onEscape={onCancel} error={formError} hint={hint}>
      <div className="flex flex-wrap items-start gap-x-3 gap-y-2">
        <Field compact label="Opening" error={e.label?.message} className="min-w-0 flex-[1_1_14rem]">
          <Input
            autoComplete="off"
            placeholder={mode === 'add' ? 'Door or window, like “Den window”' : 'Like “Den window”'}
            autoFocus={autoFocus}
            {...labelField}
            ref={bothRefs(labelField.ref, focusRef)}
          />
        </Field>
        <Field compact label="Kind of opening" error={e.kind?.message} className="w-36">
          <Select {...register('kind', { onChange: () => setKindByHand(true) })}>
            {OPENING_KINDS.map((k) => (
              <option key={k} value={k}>
                {OPENING_KIND_LABELS[k]}
              </option>
            ))}
          </Select>
        </Field>
        <CheckBox label="Reachable from the ground" {...register('groundReachable')} />
        <Actions mode={mode} busy={formState.isSubmitting} addLabel="Add" onCancel={onCancel} />
      </div>
    </FormShell>
  );
}

export type { FloorFormValues, RoomFormValues, OpeningFormValues };
