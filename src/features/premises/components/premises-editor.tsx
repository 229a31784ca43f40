/**
 * The premises of a site, built quickly from the keyboard: floors, their rooms, the rooms'
 * openings, each editable and deletable in place, and per floor a plan image with zone pins.
 */
import { useMemo, useState } from 'react';
import { AlertTriangle, Building, CheckCircle2, CircleHelp, Keyboard, Pencil, Plus, Trash2 } from 'lucide-react';
import { DEVICE_TYPE_LABELS, ZONE_STATUS_LABELS } from '@domain/devices';
import { OPENING_KIND_LABELS, ROOM_KIND_LABELS } from '@domain/premises';
import { OpeningSymbol, OpeningStateWords } from '@/components/coverage/opening-symbol';
import { Badge } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import type { ApiCoverage, ApiCoverageOpening, ApiFloor, ApiOpening, ApiPremises, ApiPremisesZone, ApiRoom } from '@/types/api';
import {
  useCreateFloor,
  useCreateOpening,
  useCreateRoom,
  useDeleteFloor,
  useDeleteOpening,
  useDeleteRoom,
  useUpdateFloor,
  useUpdateOpening,
  useUpdateRoom,
} from '../api/premises-queries';
import { ConfirmDialog, type PendingConfirm } from './confirm-dialog';
import { IconButton } from './icon-button';
import { FloorPlanPanel } from './floor-plan-panel';
import { FocusRegistryProvider, focusKeys, useFocusRegistry } from './focus-registry';
import { FloorForm, OpeningForm, RoomForm, type SiteRoomOption } from './inline-forms';

function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** "Level 0", "Level -1 · below grade" */
export function floorLevelWords(floor: Pick<ApiFloor, 'level' | 'belowGrade'>): string {
  return `Level ${floor.level}${floor.belowGrade ? ' · below grade' : ''}`;
}

interface EditorContext {
  siteId: string;
  canEdit: boolean;
  floors: ApiFloor[];
  /** every room of the site, for a bedroom's hall and a bathroom's bedroom */
  siteRooms: SiteRoomOption[];
  zones: ApiPremisesZone[] | undefined;
  coverageByOpening: Map<string, ApiCoverageOpening> | undefined;
  confirm: (pending: PendingConfirm) => void;
  announce: (message: string) => void;
  /** the room whose "add a door or window" line is open */
  openingLineFor: string | null;
  setOpeningLineFor: (roomId: string | null) => void;
}

interface PremisesEditorProps {
  siteId: string;
  premises: ApiPremises;
  zones: ApiPremisesZone[] | undefined;
  coverage: ApiCoverage | undefined;
  canEdit: boolean;
}

export function PremisesEditor(props: PremisesEditorProps) {
  return (
    <FocusRegistryProvider>
      <Editor {...props} />
    </FocusRegistryProvider>
  );
}

function Editor({ siteId, premises, zones, coverage, canEdit }: PremisesEditorProps) {
  const focus = useFocusRegistry();
  const createFloor = useCreateFloor(siteId);
  const [pending, setPending] = useState<PendingConfirm | null>(null);
  const [announcement, setAnnouncement] = useState('');
  const [openingLineFor, setOpeningLineFor] = useState<string | null>(null);
  const coverageByOpening = useMemo(() => {
    if (!coverage) return undefined;
    const map = new Map<string, ApiCoverageOpening>();
    for (const floor of coverage.floors) for (const room of floor.rooms) for (const o of room.openings) map.set(o.id, o);
    return map;
  }, [coverage]);
  const floors = premises.floors;
  const siteRooms = useMemo(
    () => floors.flatMap((f) => f.rooms.map((r) => ({ id: r.id, name: r.name, kind: r.kind, floorId: f.id, floorName: f.name }))),
    [floors],
  );
  const nextLevel = floors.length === 0 ? 0 : Math.max(...floors.map((f) => f.level)) + 1;
  const ctx: EditorContext = {
    siteId,
    canEdit,
    floors,
    siteRooms,
    zones,
    coverageByOpening,
    confirm: setPending,
    announce: setAnnouncement,
    openingLineFor,
    setOpeningLineFor,
  };

  const addFloor = canEdit && (
    <section aria-labelledby="add-floor-heading" className="rounded-md border border-dashed border-line-strong bg-card p-4">
      <h2 id="add-floor-heading" className="mb-3 text-sm font-semibold">
        {floors.length === 0 ? 'Start with the first floor' : 'Add a floor'}
      </h2>
      <FloorForm
        mode="add"
        label="Add a floor"
        initial={{ name: '', level: nextLevel, belowGrade: false }}
        focusRef={focus.register(focusKeys.newFloor)}
        autoFocus={floors.length === 0}
        hint="Level 0 is the ground floor, 1 upstairs, −1 a basement."
        onSave={async (values) => {
          const floor = await createFloor.mutateAsync(values);
          setAnnouncement(`Floor ${floor.name} added. Now its rooms.`);
          focus.request(focusKeys.newRoom(floor.id));
        }}
      />
    </section>
  );

  return (
    <div className="space-y-6">
      <p className="sr-only" aria-live="polite">
        {announcement}
      </p>
      {canEdit && (
        <p className="hidden items-start gap-2 text-sm text-slate-500 sm:flex">
          <Keyboard className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
          <span>
            Type a whole floor without the mouse: <kbd className="rounded border border-line-strong bg-card px-1 font-mono text-xs">Enter</kbd> adds a
            floor, room or opening and moves on to what comes next; Enter on an empty line goes to the next room or floor;{' '}
            <kbd className="rounded border border-line-strong bg-card px-1 font-mono text-xs">Esc</kbd> closes a line or cancels an edit.
          </span>
        </p>
      )}
      {floors.length === 0 && !canEdit && (
        <div className="flex flex-col items-center gap-2 rounded-md border border-dashed border-line-strong bg-card px-6 py-10 text-center">
          <Building className="size-6 text-slate-500" aria-hidden="true" />
          <p className="font-medium">No floors recorded yet</p>
          <p className="max-w-md text-sm text-slate-500">Coordinators and technicians record the floors, rooms, doors and windows of this site.</p>
        </div>
      )}
      {floors.map((floor) => (
        <FloorSection key={floor.id} floor={floor} ctx={ctx} />
      ))}
      {addFloor}
      <ConfirmDialog pending={pending} onClose={() => setPending(null)} />
    </div>
  );
}

// ---------------------------------------------------------------------------------------------

function errorText(err: unknown): string {
  return err instanceof ApiError ? err.message : 'Something went wrong. Try again.';
}

function FloorSection({ floor, ctx }: { floor: ApiFloor; ctx: EditorContext }) {
  const focus = useFocusRegistry();
  const toast = useToast();
  const [editing, setEditing] = useState(false);
  const update = useUpdateFloor(ctx.siteId);
  const remove = useDeleteFloor(ctx.siteId);
  const createRoom = useCreateRoom(ctx.siteId);
  const openings = floor.rooms.reduce((n, r) => n + r.openings.length, 0);
  const headingId = `floor-${floor.id}`;
  const floorIndex = ctx.floors.findIndex((f) => f.id === floor.id);
  const nextFloor = ctx.floors[floorIndex + 1];

  const askDelete = () => {
    const run = () => remove.mutateAsync(floor.id);
    const done = () => {
      toast.success(`Floor “${floor.name}” deleted.`);
      focus.request(focusKeys.newFloor);
    };
    if (floor.rooms.length === 0 && !floor.planImageId) {
      run().then(done, (err: unknown) => toast.error(errorText(err)));
      return;
    }
    const contents = [
      floor.rooms.length > 0 && `its ${plural(floor.rooms.length, 'room')}${openings > 0 ? ` and ${plural(openings, 'opening')}` : ''}`,
      floor.planImageId && 'its plan image',
    ]
      .filter(Boolean)
      .join(' and ');
    ctx.confirm({
      title: `Delete “${floor.name}”?`,
      description: `This deletes ${contents}. Zones linked to them stay on their panel, no longer linked, and their pins on this floor are taken off.`,
      confirmLabel: 'Delete floor',
      run,
      done,
    });
  };

  return (
    <section aria-labelledby={headingId} className="rounded-md border border-line bg-card">
      <header className="border-b border-line px-4 py-3">
        {editing ? (
          <FloorForm
            mode="edit"
            label={`Edit ${floor.name}`}
            autoFocus
            initial={{ name: floor.name, level: floor.level, belowGrade: floor.belowGrade }}
            onCancel={() => {
              setEditing(false);
              focus.request(focusKeys.item(floor.id));
            }}
            onSave={async (values) => {
              await update.mutateAsync({ id: floor.id, input: values });
              setEditing(false);
              focus.request(focusKeys.item(floor.id));
            }}
          />
        ) : (
          <div className="flex items-start justify-between gap-3">
            <div className="min-w-0">
              <h2 id={headingId} className="text-lg font-semibold break-words">
                {floor.name}
              </h2>
              <p className="text-sm text-slate-500">
                {floorLevelWords(floor)} · {plural(floor.rooms.length, 'room')} · {plural(openings, 'opening')}
              </p>
            </div>
            {ctx.canEdit && (
              <div className="flex shrink-0 gap-1">
                <IconButton label={`Edit ${floor.name}`} onClick={() => setEditing(true)} ref={focus.register(focusKeys.item(floor.id))}>
                  <Pencil className="size-4" aria-hidden="true" />
                </IconButton>
                <IconButton label={`Delete ${floor.name}`} onClick={askDelete}>
                  <Trash2 className="size-4" aria-hidden="true" />
                </IconButton>
              </div>
            )}
          </div>
        )}
      </header>

      <div className="space-y-4 px-4 py-4">
        {floor.rooms.length === 0 && !ctx.canEdit && <p className="text-sm text-slate-500">No rooms recorded on this floor.</p>}
        {floor.rooms.length > 0 && (
          <ul className="space-y-3" aria-label={`Rooms on ${floor.name}`}>
            {floor.rooms.map((room) => (
              <RoomBlock key={room.id} room={room} floor={floor} ctx={ctx} />
            ))}
          </ul>
        )}
        {ctx.canEdit && (
          <div className="rounded-md bg-paper px-3 py-3">
            <RoomForm
              mode="add"
              label={`Add a room to ${floor.name}`}
              initial={{ name: '', kind: 'other', fuelBurningAppliance: false, attachedGarage: true, servedByHallId: '', hallWithin21FtConfirmed: false, attachedToBedroomId: '' }}
              siteRooms={ctx.siteRooms}
              focusRef={focus.register(focusKeys.newRoom(floor.id))}
              hint={floor.rooms.length === 0 ? 'The kind follows the name (“Bedroom 2”, “Kitchen”) until you choose one.' : undefined}
              onEmpty={() => focus.request(nextFloor ? focusKeys.newRoom(nextFloor.id) : focusKeys.newFloor)}
              onSave={async (values) => {
                const room = await createRoom.mutateAsync({ floorId: floor.id, input: values });
                ctx.announce(`Room ${room.name} added. Now its doors and windows.`);
                ctx.setOpeningLineFor(room.id);
                focus.request(focusKeys.newOpening(room.id));
              }}
            />
          </div>
        )}
      </div>

      <FloorPlanPanel siteId={ctx.siteId} floor={floor} floors={ctx.floors} zones={ctx.zones} canEdit={ctx.canEdit} />
    </section>
  );
}

function RoomBlock({ room, floor, ctx }: { room: ApiRoom; floor: ApiFloor; ctx: EditorContext }) {
  const focus = useFocusRegistry();
  const toast = useToast();
  const [editing, setEditing] = useState(false);
  const update = useUpdateRoom(ctx.siteId);
  const remove = useDeleteRoom(ctx.siteId);
  const createOpening = useCreateOpening(ctx.siteId);
  const devices = (ctx.zones ?? []).filter((z) => z.roomId === room.id && !z.openingId && z.status !== 'removed');
  const groundDefault = floor.level <= 0;

  const askDelete = () => {
    const run = () => remove.mutateAsync(room.id);
    const done = () => {
      toast.success(`Room “${room.name}” deleted.`);
      focus.request(focusKeys.newRoom(floor.id));
    };
    const linked = (ctx.zones ?? []).filter((z) => z.roomId === room.id && z.status !== 'removed').length;
    if (room.openings.length === 0 && linked === 0) {
      run().then(done, (err: unknown) => toast.error(errorText(err)));
      return;
    }
    ctx.confirm({
      title: `Delete “${room.name}”?`,
      description: [
        room.openings.length > 0 ? `This deletes its ${plural(room.openings.length, 'opening')}.` : 'This deletes the room.',
        linked > 0 ? `${plural(linked, 'zone')} linked to it stay${linked === 1 ? 's' : ''} on the panel, no longer linked.` : '',
      ]
        .filter(Boolean)
        .join(' '),
      confirmLabel: 'Delete room',
      run,
      done,
    });
  };

  return (
    <li className="rounded-md border border-line">
      <div className="border-b border-line bg-paper/50 px-3 py-2">
        {editing ? (
          <RoomForm
            mode="edit"
            label={`Edit ${room.name}`}
            autoFocus
            initial={{
              name: room.name,
              kind: room.kind,
              fuelBurningAppliance: room.fuelBurningAppliance,
              attachedGarage: room.attachedGarage,
              servedByHallId: room.servedByHallId ?? '',
              hallWithin21FtConfirmed: room.hallWithin21FtConfirmed ?? false,
              attachedToBedroomId: room.attachedToBedroomId ?? '',
            }}
            siteRooms={ctx.siteRooms}
            roomId={room.id}
            onCancel={() => {
              setEditing(false);
              focus.request(focusKeys.item(room.id));
            }}
            onSave={async (values) => {
              await update.mutateAsync({ id: room.id, input: values });
              setEditing(false);
              focus.request(focusKeys.item(room.id));
            }}
          />
        ) : (
          <div className="flex items-start justify-between gap-3">
            <div className="min-w-0">
              <h3 className="font-medium break-words">
                {room.name} <span className="text-sm font-normal text-slate-500">· {ROOM_KIND_LABELS[room.kind]}</span>
              </h3>
              {(room.fuelBurningAppliance || (room.kind === 'garage' && room.attachedGarage) || devices.length > 0) && (
                <div className="mt-1 flex flex-wrap gap-1.5">
                  {room.fuelBurningAppliance && <Badge tone="warn">Fuel-burning appliance</Badge>}
                  {room.kind === 'garage' && room.attachedGarage && <Badge tone="warn">Attached garage</Badge>}
                  {devices.map((z) => (
                    <Badge key={z.id} tone={z.status === 'active' ? 'neutral' : 'warn'}>
                      Zone {z.number} · {z.description}
                      <span className="sr-only"> ({DEVICE_TYPE_LABELS[z.deviceType]})</span>
                      {z.status !== 'active' ? ` · ${ZONE_STATUS_LABELS[z.status].toLowerCase()}` : ''}
                    </Badge>
                  ))}
                </div>
              )}
              <RoomLinks room={room} floor={floor} siteRooms={ctx.siteRooms} />
            </div>
            {ctx.canEdit && (
              <div className="flex shrink-0 gap-1">
                <IconButton label={`Edit ${room.name}`} onClick={() => setEditing(true)} ref={focus.register(focusKeys.item(room.id))}>
                  <Pencil className="size-4" aria-hidden="true" />
                </IconButton>
                <IconButton label={`Delete ${room.name}`} onClick={askDelete}>
                  <Trash2 className="size-4" aria-hidden="true" />
                </IconButton>
              </div>
            )}
          </div>
        )}
      </div>
      {room.openings.length > 0 && (
        <ul className="divide-y divide-line" aria-label={`Doors and windows of ${room.name}`}>
          {room.openings.map((o) => (
            <OpeningRow key={o.id} opening={o} room={room} ctx={ctx} />
          ))}
        </ul>
      )}
      {room.openings.length === 0 && !ctx.canEdit && <p className="px-3 py-2 text-sm text-slate-500">No doors or windows recorded.</p>}
      {ctx.canEdit &&
        (ctx.openingLineFor === room.id ? (
          <div className="border-t border-line bg-brass-50/40 px-3 py-2.5">
            <OpeningForm
              mode="add"
              label={`Add an opening to ${room.name}`}
              initial={{ label: '', kind: 'window', groundReachable: groundDefault }}
              focusRef={focus.register(focusKeys.newOpening(room.id))}
              onEmpty={() => {
                ctx.setOpeningLineFor(null);
                focus.request(focusKeys.newRoom(floor.id));
              }}
              onCancel={() => {
                ctx.setOpeningLineFor(null);
                focus.request(focusKeys.openingButton(room.id));
              }}
              onSave={async (values) => {
                const opening = await createOpening.mutateAsync({ roomId: room.id, input: values });
                ctx.announce(`${OPENING_KIND_LABELS[opening.kind]} ${opening.label} added.`);
              }}
            />
          </div>
        ) : (
          <div className={room.openings.length > 0 ? 'border-t border-line px-1.5 py-1' : 'px-1.5 py-1'}>
            <Button
              ref={focus.register(focusKeys.openingButton(room.id))}
              variant="ghost"
              size="sm"
              className="text-brass-700"
              onClick={() => {
                ctx.setOpeningLineFor(room.id);
                focus.request(focusKeys.newOpening(room.id));
              }}
            >
              <Plus className="size-4" aria-hidden="true" /> Add door or window<span className="sr-only"> to {room.name}</span>
            </Button>
          </div>
        ))}
    </li>
  );
}

/** "Upstairs landing", or "Upstairs landing (First floor)" when it is on another floor. */
function roomName(id: string, floor: ApiFloor, siteRooms: readonly SiteRoomOption[]): string | null {
  const room = siteRooms.find((r) => r.id === id);
  if (!room) return null;
  return room.floorId === floor.id ? room.name : `${room.name} (${room.floorName})`;
}

/**
 * A bedroom's sleeping area and a bathroom's bedroom, in words with a mark and a colour:
 * "Sleeping area: Upstairs landing · 21 ft confirmed", "… · 21 ft not confirmed", "no hall chosen".
 */
export function RoomLinks({ room, floor, siteRooms }: { room: ApiRoom; floor: ApiFloor; siteRooms: readonly SiteRoomOption[] }) {
  if (room.kind === 'bedroom') {
    const hall = room.servedByHallId ? roomName(room.servedByHallId, floor, siteRooms) : null;
    if (!hall)
      return (
        <p className="mt-1 flex items-start gap-1.5 text-xs text-ochre-600">
          <CircleHelp className="mt-px size-3.5 shrink-0" aria-hidden="true" />
          <span>Sleeping area: no hall or landing chosen</span>
        </p>
      );
    const confirmed = room.hallWithin21FtConfirmed === true;
    return (
      <p className={cn('mt-1 flex items-start gap-1.5 text-xs', confirmed ? 'text-sage-600' : 'text-ochre-600')}>
        {confirmed ? <CheckCircle2 className="mt-px size-3.5 shrink-0" aria-hidden="true" /> : <AlertTriangle className="mt-px size-3.5 shrink-0" aria-hidden="true" />}
        <span>
          Sleeping area: <span className="font-medium">{hall}</span> · 21 ft {confirmed ? 'confirmed' : 'not confirmed'}
        </span>
      </p>
    );
  }
  if (room.kind === 'bath' && room.attachedToBedroomId) {
    const bedroom = roomName(room.attachedToBedroomId, floor, siteRooms);
    if (!bedroom) return null;
    return (
      <p className="mt-1 text-xs text-slate-500">
        Attached to bedroom: <span className="font-medium text-ink">{bedroom}</span>
      </p>
    );
  }
  return null;
}

function OpeningRow({ opening, room, ctx }: { opening: ApiOpening; room: ApiRoom; ctx: EditorContext }) {
  const focus = useFocusRegistry();
  const toast = useToast();
  const [editing, setEditing] = useState(false);
  const update = useUpdateOpening(ctx.siteId);
  const remove = useDeleteOpening(ctx.siteId);
  const covered = ctx.coverageByOpening?.get(opening.id);
  const linked = (ctx.zones ?? []).filter((z) => z.openingId === opening.id && z.status !== 'removed');
  const idle = linked.filter((z) => z.status !== 'active');

  const askDelete = () => {
    const run = () => remove.mutateAsync(opening.id);
    const done = () => {
      toast.success(`“${opening.label}” deleted.`);
      focus.request(focusKeys.newOpening(room.id));
    };
    if (linked.length === 0) {
      run().then(done, (err: unknown) => toast.error(errorText(err)));
      return;
    }
    ctx.confirm({
      title: `Delete “${opening.label}”?`,
      description: `${linked.map((z) => `Zone ${z.number} “${z.description}”`).join(', ')} protect${linked.length === 1 ? 's' : ''} it; the zone stays on the panel, no longer linked.`,
      confirmLabel: 'Delete opening',
      run,
      done,
    });
  };

  if (editing)
    return (
      <li className="px-3 py-2.5">
        <OpeningForm
          mode="edit"
          label={`Edit ${opening.label}`}
          autoFocus
          initial={{ label: opening.label, kind: opening.kind, groundReachable: opening.groundReachable }}
          onCancel={() => {
            setEditing(false);
            focus.request(focusKeys.item(opening.id));
          }}
          onSave={async (values) => {
            await update.mutateAsync({ id: opening.id, input: values });
            setEditing(false);
            focus.request(focusKeys.item(opening.id));
          }}
        />
      </li>
    );

  return (
    <li className="flex items-center gap-3 px-3 py-2">
      {covered ? <OpeningSymbol kind={opening.kind} state={covered.protected ? 'protected' : 'none'} /> : <Skeleton className="size-8 shrink-0" />}
      <div className="min-w-0 flex-1">
        <p className="text-sm break-words">
          <span className="font-medium">{opening.label}</span>
          <span className="text-slate-500">
            {' '}
            · {OPENING_KIND_LABELS[opening.kind]}
            {opening.groundReachable ? ' · reachable from the ground' : ''}
          </span>
        </p>
        <p className="text-sm">
          {covered ? (
            <OpeningStateWords state={covered.protected ? 'protected' : 'none'} zoneDescription={covered.zoneDescription} />
          ) : (
            <span className="text-slate-500">Checking coverage…</span>
          )}
          {idle.map((z) => (
            <span key={z.id} className="block text-xs text-ochre-600">
              Zone {z.number} “{z.description}” is {ZONE_STATUS_LABELS[z.status].toLowerCase()}.
            </span>
          ))}
        </p>
      </div>
      {ctx.canEdit && (
        <div className="flex shrink-0 gap-1">
          <IconButton label={`Edit ${opening.label}`} onClick={() => setEditing(true)} ref={focus.register(focusKeys.item(opening.id))}>
            <Pencil className="size-4" aria-hidden="true" />
          </IconButton>
          <IconButton label={`Delete ${opening.label}`} onClick={askDelete}>
            <Trash2 className="size-4" aria-hidden="true" />
          </IconButton>
        </div>
      )}
    </li>
  );
}
