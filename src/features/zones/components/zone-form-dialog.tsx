import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { useForm, type DefaultValues } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { AlertTriangle, CheckCircle2, Clock, RotateCcw } from 'lucide-react';
import {
  BATTERY_TYPES,
  DEVICE_TYPE_LABELS,
  DEVICE_TYPE_STANDARDS,
  DEVICE_TYPES,
  isLifeSafetyDevice,
  ZONE_STATUS_LABELS,
  ZONE_STATUSES,
  ZONE_TYPE_LABELS,
  ZONE_TYPES,
  OPENING_DEVICE_TYPES,
  type DeviceType,
} from '@domain/devices';
import { LIFE_SAFETY_CAUTION } from '@domain/life-safety';
import { checkLifeSafetyZone, lifeSafetyZoneTypesFor, type LifeSafetyZoneProblem } from '@domain/life-safety-zone';
import { uuid } from '@domain/schemas/common';
import { zoneSchema } from '@domain/schemas/zone';
import { zoneDefaultsFor, zoneWarnings, type ZoneDefaults } from '@domain/zones';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError, FormField } from '@/components/ui/form-field';
import { Input, Select } from '@/components/ui/input';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { applyServerErrors } from '@/lib/form-errors';
import type { ApiPanel, ApiPremises, ApiZone } from '@/types/api';
import { premisesQuery, usePremisesChanged } from '@/features/premises/api/premises-queries';
import { CheckField } from '@/features/panels/components/check-field';
import { panelZonesQuery, useCreateZone, useUpdateZone } from '../api/zone-queries';
import { elsewhereNotes } from './zone-bits';

/** The room and opening selects: an empty choice is no link. */
const premisesLink = z.preprocess((v) => (v === '' || v === undefined ? null : v), uuid.nullable());

/** The zone form edits every field, the room/opening link chosen from the site's premises. */
const zoneFormSchema = zoneSchema.extend({ roomId: premisesLink, openingId: premisesLink });
type ZoneFormInput = z.input<typeof zoneFormSchema>;
type ZoneFormValues = z.output<typeof zoneFormSchema>;

const FIELDS = [
  'number',
  'description',
  'roomId',
  'openingId',
  'deviceType',
  'zoneType',
  'serial',
  'input',
  'reportsToMonitoring',
  'chime',
  'supervised',
  'status',
  'installedOn',
  'batteryType',
  'batteryChangedOn',
  'manufacturedOn',
] as const satisfies readonly (keyof ZoneFormInput)[];

const BEHAVIOUR_KEYS = ['zoneType', 'reportsToMonitoring', 'chime', 'supervised'] as const satisfies readonly (keyof ZoneDefaults)[];

const DEFAULT_DEVICE: DeviceType = 'door_contact';

/**
 * A device type as the select shows it, with the standard a life-safety type is listed to:
 * "Smoke alarm (UL 217)", "Smoke and CO alarm (combination, UL 217 and UL 2034)".
 */
export function deviceTypeOptionLabel(type: DeviceType): string {
  const label = DEVICE_TYPE_LABELS[type];
  const standard = DEVICE_TYPE_STANDARDS[type];
  if (!standard) return label;
  return label.endsWith(')') ? `${label.slice(0, -1)}, ${standard})` : `${label} (${standard})`;
}

/** "Hall smoke" lower-cased for running text, keeping "CO" as it is. */
function lowerFirst(text: string): string {
  return /^[A-Z][A-Z]/.test(text) ? text : text.charAt(0).toLowerCase() + text.slice(1);
}

function followsDefaults(zone: ApiZone): boolean {
  const defaults = zoneDefaultsFor(zone.deviceType);
  return BEHAVIOUR_KEYS.every((key) => zone[key] === defaults[key]);
}

function initialValues(panel: ApiPanel, zone: ApiZone | undefined): DefaultValues<ZoneFormInput> {
  if (zone) {
    return {
      number: zone.number,
      description: zone.description,
      deviceType: zone.deviceType,
      zoneType: zone.zoneType,
      serial: zone.serial,
      input: zone.input,
      reportsToMonitoring: zone.reportsToMonitoring,
      chime: zone.chime,
      supervised: zone.supervised,
      status: zone.status,
      roomId: zone.roomId ?? '',
      openingId: zone.openingId ?? '',
      installedOn: zone.installedOn ?? '',
      batteryType: zone.batteryType ?? '',
      batteryChangedOn: zone.batteryChangedOn ?? '',
      manufacturedOn: zone.manufacturedOn ?? '',
    };
  }
  return {
    number: panel.nextZoneNumber ?? undefined,
    description: '',
    deviceType: DEFAULT_DEVICE,
    serial: '',
    input: 1,
    ...zoneDefaultsFor(DEFAULT_DEVICE),
    status: 'active',
    roomId: '',
    openingId: '',
    installedOn: '',
    batteryType: '',
    batteryChangedOn: '',
    manufacturedOn: '',
  };
}

interface ZoneFormDialogProps {
  open: boolean;
  onClose: () => void;
  panel: ApiPanel;
  /** The zone to edit; leave out to add a zone. */
  zone?: ApiZone | undefined;
}

/** Add or edit a zone, its fields grouped as Where / Device / Behaviour. */
export function ZoneFormDialog({ open, onClose, panel, zone }: ZoneFormDialogProps) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title={zone ? `Edit zone ${zone.number}` : 'Add zone'}
      description={zone ? `On ${panel.label}. Saving marks the panel as changed since last programmed.` : `Enrol a device on ${panel.label}. Behaviour follows the device type until you change it.`}
    >
      <ZoneForm panel={panel} zone={zone} onDone={onClose} />
    </Dialog>
  );
}

function ZoneForm({ panel, zone, onDone }: { panel: ApiPanel; zone: ApiZone | undefined; onDone: () => void }) {
  const create = useCreateZone(panel.id);
  const update = useUpdateZone(panel.id);
  const premises = useQuery(premisesQuery(panel.siteId));
  const premisesChanged = usePremisesChanged(panel.siteId);
  const toast = useToast();
  const [formError, setFormError] = useState<string | null>(null);
  const [byHand, setByHand] = useState(() => (zone ? !followsDefaults(zone) : false));
  const { register, handleSubmit, setError, setValue, watch, formState } = useForm<ZoneFormInput, unknown, ZoneFormValues>({
    resolver: zodResolver(zoneFormSchema),
    defaultValues: initialValues(panel, zone),
  });
  const e = formState.errors;
  const deviceType = watch('deviceType');
  const number = watch('number');
  const serial = watch('serial');
  const input = watch('input');
  const watchOpening = watch('openingId');
  const zoneType = watch('zoneType');
  const reportsToMonitoring = watch('reportsToMonitoring');
  const supervised = watch('supervised');
  const status = watch('status');
  const siblings = useQuery({ ...panelZonesQuery(panel.id), enabled: deviceType === 'smoke_co' });
  const lifeSafetyCheck = isLifeSafetyDevice(deviceType)
    ? checkLifeSafetyZone(
        {
          id: zone?.id ?? 'new',
          number: typeof number === 'number' && Number.isFinite(number) ? number : null,
          description: String(watch('description') ?? ''),
          deviceType,
          zoneType: zoneType ?? 'perimeter',
          reportsToMonitoring: reportsToMonitoring === true,
          supervised: supervised === true,
          status: status ?? 'active',
          serial: String(serial ?? ''),
          panelId: panel.id,
        },
        siblings.data ?? [],
      )
    : null;

  const applyDefaults = (type: DeviceType) => {
    const defaults = zoneDefaultsFor(type);
    for (const key of BEHAVIOUR_KEYS) setValue(key, defaults[key], { shouldDirty: true, shouldValidate: formState.isSubmitted });
  };
  const markByHand = () => setByHand(true);

  const roomOfOpening = (openingId: string) => premises.data?.floors.flatMap((f) => f.rooms).find((r) => r.openings.some((o) => o.id === openingId));
  const onOpeningChange = (ev: React.ChangeEvent<HTMLSelectElement>) => {
    const room = ev.target.value ? roomOfOpening(ev.target.value) : undefined;
    if (room) setValue('roomId', room.id, { shouldDirty: true });
  };
  const onRoomChange = (ev: React.ChangeEvent<HTMLSelectElement>) => {
    const openingId = typeof watchOpening === 'string' ? watchOpening : '';
    if (openingId && roomOfOpening(openingId)?.id !== ev.target.value) setValue('openingId', '', { shouldDirty: true });
  };

  const numberWarning =
    typeof number === 'number' && Number.isFinite(number) ? zoneWarnings({ number, serial: String(serial ?? ''), input: Number(input) || 1 }, panel)[0]?.message : undefined;
  const numberHint =
    numberWarning ??
    (zone
      ? undefined
      : panel.nextZoneNumber !== null
        ? `Next free wireless number: ${panel.nextZoneNumber} (wireless zones ${panel.wirelessZoneFrom}–${panel.wirelessZoneTo}).`
        : `The wireless zones ${panel.wirelessZoneFrom}–${panel.wirelessZoneTo} are all used. Choose a number up to ${panel.zoneCapacity}.`);

  const onSubmit = handleSubmit((values) => {
    setFormError(null);
    const failed = (err: unknown) => setFormError(applyServerErrors(err, setError, FIELDS));
    if (zone) {
      update.mutate(
        { zoneId: zone.id, input: values },
        {
          onSuccess: (saved) => {
            void premisesChanged();
            toast.success([`Zone ${saved.number} “${saved.description}” saved.`, ...elsewhereNotes(saved)].join(' '));
            onDone();
          },
          onError: failed,
        },
      );
    } else {
      create.mutate(values, {
        onSuccess: (saved) => {
          void premisesChanged();
          toast.success([`Zone ${saved.number} “${saved.description}” added.`, ...elsewhereNotes(saved)].join(' '));
          onDone();
        },
        onError: failed,
      });
    }
  });

  const legend = 'mb-3 text-xs font-semibold tracking-wide text-slate-500 uppercase';
  const elsewhere = zone ? elsewhereNotes(zone) : [];

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5">
      <FormError message={formError} />

      <fieldset>
        <legend className={legend}>Where</legend>
        <div className="grid grid-cols-[6.5rem_1fr] gap-3">
          <FormField label="Zone number" error={e.number?.message}>
            <Input type="number" inputMode="numeric" min={1} max={panel.zoneCapacity} className="tabular-nums" {...register('number', { valueAsNumber: true })} />
          </FormField>
          <FormField label="Description" error={e.description?.message}>
            <Input maxLength={40} autoComplete="off" placeholder="Like “Den window”" {...register('description')} />
          </FormField>
        </div>
        {numberHint && !e.number && <p className={numberWarning ? 'mt-1 text-xs font-medium text-ochre-600' : 'mt-1 text-xs text-slate-500'}>{numberHint}</p>}
        <p className="mt-1 text-xs text-slate-500">Describe it as the household says it; keypads show up to 40 characters.</p>
        <PremisesSelects
          premises={premises.data}
          loading={premises.isPending}
          failed={premises.isError}
          siteId={panel.siteId}
          contact={OPENING_DEVICE_TYPES.includes(deviceType)}
          roomField={register('roomId', { onChange: onRoomChange })}
          openingField={register('openingId', { onChange: onOpeningChange })}
          roomError={e.roomId?.message}
          openingError={e.openingId?.message}
        />
      </fieldset>

      <fieldset>
        <legend className={legend}>Device</legend>
        <div className="grid gap-3 sm:grid-cols-2">
          <FormField label="Device type" error={e.deviceType?.message} className="sm:col-span-2">
            <Select
              {...register('deviceType', {
                onChange: (ev: React.ChangeEvent<HTMLSelectElement>) => {
                  if (!byHand) applyDefaults(ev.target.value as DeviceType);
                },
              })}
            >
              {DEVICE_TYPES.map((t) => (
                <option key={t} value={t}>
                  {deviceTypeOptionLabel(t)}
                </option>
              ))}
            </Select>
          </FormField>
          <FormField
            label="Serial"
            error={e.serial?.message}
            hint={elsewhere.length > 0 ? elsewhere.join(' ') : 'As printed on the device; leading zeros count.'}
          >
            <Input className="font-mono" autoComplete="off" autoCapitalize="characters" spellCheck={false} {...register('serial')} />
          </FormField>
          <FormField label="Input" error={e.input?.message} hint="Contact input on the transmitter (1–8).">
            <Input type="number" inputMode="numeric" min={1} max={8} className="tabular-nums" {...register('input', { valueAsNumber: true })} />
          </FormField>
          <FormField label="Battery type" error={e.batteryType?.message} hint="Pick one or type another.">
            <Input list="zone-battery-types" autoComplete="off" {...register('batteryType')} />
          </FormField>
          <datalist id="zone-battery-types">
            {BATTERY_TYPES.map((b) => (
              <option key={b} value={b} />
            ))}
          </datalist>
          <FormField label="Installed on" error={e.installedOn?.message}>
            <Input type="date" {...register('installedOn')} />
          </FormField>
          <FormField label="Battery changed on" error={e.batteryChangedOn?.message} hint="Leave empty if never changed since install.">
            <Input type="date" {...register('batteryChangedOn')} />
          </FormField>
          <FormField
            label="Manufactured on"
            error={e.manufacturedOn?.message}
            hint={isLifeSafetyDevice(deviceType) ? 'Printed on the alarm; end of life counts from this date.' : 'For smoke, heat and CO alarms.'}
          >
            <Input type="date" {...register('manufacturedOn')} />
          </FormField>
        </div>
        {isLifeSafetyDevice(deviceType) && <p className="mt-2 text-xs text-slate-500">{LIFE_SAFETY_CAUTION}</p>}
      </fieldset>

      <fieldset>
        <legend className={legend}>Behaviour</legend>
        <div className="space-y-3">
          <FormField label="Zone type" error={e.zoneType?.message}>
            <Select {...register('zoneType', { onChange: markByHand })}>
              {ZONE_TYPES.map((t) => (
                <option key={t} value={t}>
                  {ZONE_TYPE_LABELS[t]}
                </option>
              ))}
            </Select>
          </FormField>
          <div className="space-y-2.5">
            <CheckField label="Reports to monitoring center" {...register('reportsToMonitoring', { onChange: markByHand })} />
            <CheckField label="Chime" hint="The keypad announces it when opened while disarmed." {...register('chime', { onChange: markByHand })} />
            <CheckField label="Supervised" hint="The panel shows trouble if the device stops checking in." {...register('supervised', { onChange: markByHand })} />
          </div>
          {lifeSafetyCheck && <LifeSafetyBehaviour deviceType={deviceType} problems={lifeSafetyCheck.problems} />}
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1 text-xs text-slate-500" aria-live="polite">
            {byHand ? (
              <>
                <span>Changed by hand: the device type no longer sets these.</span>
                <button
                  type="button"
                  className="inline-flex items-center gap-1 font-medium text-brass-700 underline"
                  onClick={() => {
                    applyDefaults(deviceType);
                    setByHand(false);
                  }}
                >
                  <RotateCcw className="size-3" aria-hidden="true" /> Use the defaults for {lowerFirst(DEVICE_TYPE_LABELS[deviceType])}
                </button>
              </>
            ) : (
              <span>Filled from the defaults for {lowerFirst(DEVICE_TYPE_LABELS[deviceType])}.</span>
            )}
          </div>
          <FormField label="Status" error={e.status?.message} className="sm:max-w-60">
            <Select {...register('status')}>
              {ZONE_STATUSES.map((s) => (
                <option key={s} value={s}>
                  {ZONE_STATUS_LABELS[s]}
                </option>
              ))}
            </Select>
          </FormField>
        </div>
      </fieldset>

      <div className="flex justify-end gap-2 pt-1">
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
        <Button type="submit" busy={create.isPending || update.isPending}>
          {zone ? 'Save zone' : 'Add zone'}
        </Button>
      </div>
    </form>
  );
}

/**
 * The life-safety zone check on the Behaviour fields as they stand: a smoke, heat or CO device
 * counts as protection only on a fire or CO zone that reports and is supervised. Names what to change.
 */
function LifeSafetyBehaviour({ deviceType, problems }: { deviceType: DeviceType; problems: readonly LifeSafetyZoneProblem[] }) {
  const blocking = problems.filter((p) => p.code !== 'combination_half_missing');
  const notes = problems.filter((p) => p.code === 'combination_half_missing');
  const allowed = lifeSafetyZoneTypesFor(deviceType).map((t) => `“${ZONE_TYPE_LABELS[t]}”`);
  if (problems.length === 0)
    return (
      <p className="flex items-start gap-2 text-xs text-sage-600">
        <CheckCircle2 className="mt-px size-3.5 shrink-0" aria-hidden="true" />
        <span>Programmed to protect: {allowed.join(' or ')}, reported and supervised.</span>
      </p>
    );
  return (
    <div className={blocking.length > 0 ? 'rounded-md border border-clay-600/40 bg-clay-50 px-3 py-2 text-xs' : 'rounded-md border border-ochre-600/40 bg-ochre-50 px-3 py-2 text-xs'}>
      {blocking.length > 0 && (
        <>
          <p className="flex items-start gap-2 font-semibold text-clay-600">
            <AlertTriangle className="mt-px size-3.5 shrink-0" aria-hidden="true" />
            <span>As set, this {lowerFirst(DEVICE_TYPE_LABELS[deviceType])} does not count as protection.</span>
          </p>
          <ul className="mt-1 list-disc space-y-0.5 pl-5 text-ink">
            {blocking.map((p) => (
              <li key={p.code}>
                {p.what.charAt(0).toUpperCase() + p.what.slice(1)}: {p.fix}.
              </li>
            ))}
          </ul>
        </>
      )}
      {notes.map((p) => (
        <p key={p.code} className={blocking.length > 0 ? 'mt-1 text-ink' : 'flex items-start gap-2 text-ink'}>
          {blocking.length === 0 && <Clock className="mt-px size-3.5 shrink-0 text-ochre-600" aria-hidden="true" />}
          <span>
            {p.what.charAt(0).toUpperCase() + p.what.slice(1)}: {p.fix}.
          </span>
        </p>
      ))}
    </div>
  );
}

interface PremisesSelectsProps {
  premises: ApiPremises | undefined;
  loading: boolean;
  failed: boolean;
  siteId: string;
  /** a door, window or garage contact: the opening comes first */
  contact: boolean;
  roomField: React.SelectHTMLAttributes<HTMLSelectElement> & { ref: React.Ref<HTMLSelectElement> };
  openingField: React.SelectHTMLAttributes<HTMLSelectElement> & { ref: React.Ref<HTMLSelectElement> };
  roomError: string | undefined;
  openingError: string | undefined;
}

/**
 * Room and opening selects, grouped by floor, from the site's premises; choosing an opening
 * sets its room. They appear once the premises are in, so the select shows the saved link.
 */
function PremisesSelects({ premises, loading, failed, siteId, contact, roomField, openingField, roomError, openingError }: PremisesSelectsProps) {
  const floors = premises?.floors ?? [];
  const rooms = floors.flatMap((f) => f.rooms);
  const hasOpenings = rooms.some((r) => r.openings.length > 0);
  if (loading)
    return (
      <div className="mt-3 grid gap-3 sm:grid-cols-2" role="status" aria-label="Loading the rooms of this site">
        <Skeleton className="h-16 w-full" />
        <Skeleton className="h-16 w-full" />
      </div>
    );
  if (failed) return <p className="mt-3 text-xs text-clay-600">The rooms of this site could not be read; the zone keeps its room and opening.</p>;
  if (rooms.length === 0)
    return (
      <p className="mt-3 text-xs text-slate-500">
        No rooms recorded for this site yet.{' '}
        <Link to={paths.firm.premises(siteId)} className="font-medium text-brass-700 underline">
          Record the premises
        </Link>{' '}
        to link zones to what they protect.
      </p>
    );
  const room = (
    <FormField key="room" label="Room" error={roomError}>
      <Select {...roomField}>
        <option value="">Not linked to a room</option>
        {floors
          .filter((f) => f.rooms.length > 0)
          .map((f) => (
            <optgroup key={f.id} label={f.name}>
              {f.rooms.map((r) => (
                <option key={r.id} value={r.id}>
                  {r.name}
                </option>
              ))}
            </optgroup>
          ))}
      </Select>
    </FormField>
  );
  const opening = (
    <FormField key="opening" label="Door or window" error={openingError}>
      <Select {...openingField}>
        <option value="">{hasOpenings ? 'Not linked to an opening' : 'No doors or windows recorded'}</option>
        {floors
          .filter((f) => f.rooms.some((r) => r.openings.length > 0))
          .map((f) => (
            <optgroup key={f.id} label={f.name}>
              {f.rooms.flatMap((r) =>
                r.openings.map((o) => (
                  <option key={o.id} value={o.id}>
                    {r.name} · {o.label}
                  </option>
                )),
              )}
            </optgroup>
          ))}
      </Select>
    </FormField>
  );
  return (
    <div className="mt-3 space-y-1">
      <div className="grid gap-3 sm:grid-cols-2">{contact ? [opening, room] : [room, opening]}</div>
      <p className="text-xs text-slate-500">{contact ? 'A contact protects a door or window; choosing one sets its room.' : 'A motion, smoke or CO device protects a room.'}</p>
    </div>
  );
}
