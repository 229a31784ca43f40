/**
 * A floor's plan image: upload (with progress), replace, remove; and on the image the zone
 * pins, placed by dragging a zone from the list (or an existing pin) with a mouse, pen or
 * finger — or by choosing a zone and then clicking or tapping the plan; arrow keys move a
 * focused pin. Pins are saved as fractions of the image (PUT /api/zones/:zoneId/pin).
 */
import { useRef, useState } from 'react';
import { GripVertical, ImagePlus, MapPin, RefreshCw, Trash2, X } from 'lucide-react';
import { PIN_CLASS, PinTooltip, PlanFrame, PlanView, percent, pinLabel, planImageSrc, type PlanPin } from '@/components/coverage/plan-view';
import { Button } from '@/components/ui/button';
import { FormError } from '@/components/ui/form-field';
import { Skeleton } from '@/components/ui/skeleton';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import { cn } from '@/lib/cn';
import type { ApiFloor, ApiPremisesZone } from '@/types/api';
import { useRemovePlan, useUploadPlan } from '../api/premises-queries';
import { useClearPin, useSetPin } from '../api/site-zones';
import { toFraction } from '../guess';
import { ConfirmDialog, type PendingConfirm } from './confirm-dialog';
import { IconButton } from './icon-button';

/** The server's limit and accepted types for a plan image (server/services/premises.ts). */
export const PLAN_MAX_BYTES = 5 * 1024 * 1024;
const PLAN_TYPES = ['image/png', 'image/jpeg', 'image/webp'];

interface FloorPlanPanelProps {
  siteId: string;
  floor: ApiFloor;
  floors: ApiFloor[];
  zones: ApiPremisesZone[] | undefined;
  canEdit: boolean;
}

function pinsOf(floor: ApiFloor, zones: readonly ApiPremisesZone[], panels: number): PlanPin[] {
  return zones
    .filter((z) => z.pin?.floorId === floor.id && z.status !== 'removed')
    .map((z) => ({
      zoneId: z.id,
      number: z.number,
      description: z.description,
      panelLabel: panels > 1 ? z.panelLabel : undefined,
      x: z.pin!.x,
      y: z.pin!.y,
    }));
}

export function FloorPlanPanel({ siteId, floor, floors, zones, canEdit }: FloorPlanPanelProps) {
  const upload = useUploadPlan(siteId);
  const removePlan = useRemovePlan(siteId);
  const toast = useToast();
  const fileInput = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [pending, setPending] = useState<PendingConfirm | null>(null);
  const src = planImageSrc(floor);
  const panels = new Set((zones ?? []).map((z) => z.panelId)).size;
  const pins = zones ? pinsOf(floor, zones, panels) : [];
  const inputId = `plan-file-${floor.id}`;

  const send = (file: File | undefined) => {
    setError(null);
    if (!file) return;
    if (!PLAN_TYPES.includes(file.type)) return setError('A floor plan must be a PNG, JPEG or WebP image.');
    if (file.size > PLAN_MAX_BYTES) return setError(`That image is ${(file.size / 1024 / 1024).toFixed(1)} MB; a floor plan may be at most 5 MB.`);
    setProgress(0);
    upload.mutate(
      { floorId: floor.id, file, onProgress: setProgress },
      {
        onSuccess: () =>
          toast.success(
            src ? `Plan of ${floor.name} replaced. The pins keep their places.` : `Plan of ${floor.name} uploaded. Now place the zones on it.`,
          ),
        onError: (err) => setError(err instanceof ApiError ? err.message : 'The upload failed. Try again.'),
        onSettled: () => {
          setProgress(null);
          if (fileInput.current) fileInput.current.value = '';
        },
      },
    );
  };

  const chooseFile = () => fileInput.current?.click();
  const fileControl = canEdit && (
    <input
      ref={fileInput}
      id={inputId}
      type="file"
      accept={PLAN_TYPES.join(',')}
      className="sr-only"
      tabIndex={-1}
      aria-label={`Plan image of ${floor.name}`}
      onChange={(e) => send(e.target.files?.[0])}
    />
  );

  const askRemove = () =>
    setPending({
      title: `Remove the plan of “${floor.name}”?`,
      description:
        pins.length > 0
          ? `The image goes; the ${pins.length === 1 ? 'pin keeps its place' : `${pins.length} pins keep their places`} for a new image.`
          : 'The image goes; the rooms and openings stay.',
      confirmLabel: 'Remove plan',
      run: () => removePlan.mutateAsync(floor.id),
      done: () => toast.success(`Plan of ${floor.name} removed.`),
    });

  const progressBar = progress !== null && (
    <div
      className="h-2 w-full overflow-hidden rounded-md bg-slate-100"
      role="progressbar"
      aria-label={`Uploading the plan of ${floor.name}`}
      aria-valuemin={0}
      aria-valuemax={100}
      aria-valuenow={Math.round(progress * 100)}
    >
      <div className="h-full bg-brass-600 transition-[width]" style={{ width: `${Math.round(progress * 100)}%` }} />
    </div>
  );

  if (!src) {
    if (!canEdit) return null;
    return (
      <div className="border-t border-line px-4 py-4">
        {fileControl}
        <div className="flex flex-col gap-3 rounded-md border border-dashed border-line-strong px-4 py-4 sm:flex-row sm:items-center sm:justify-between">
          <div className="flex items-start gap-3">
            <MapPin className="mt-0.5 size-5 shrink-0 text-slate-500" aria-hidden="true" />
            <div className="text-sm">
              <p className="font-medium">No floor plan</p>
              <p className="text-slate-500">Upload a drawing or photo of the plan (PNG, JPEG or WebP, up to 5 MB) to show where each device is.</p>
            </div>
          </div>
          <Button variant="secondary" size="sm" onClick={chooseFile} busy={upload.isPending} className="self-start sm:self-auto">
            <ImagePlus className="size-4" aria-hidden="true" /> Upload plan image
          </Button>
        </div>
        <div className="mt-3 space-y-2">
          <FormError message={error} />
          {progressBar}
        </div>
      </div>
    );
  }

  return (
    <div className="border-t border-line px-4 py-4">
      {fileControl}
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h3 className="text-sm font-semibold">Floor plan</h3>
        {canEdit && (
          <div className="flex flex-wrap gap-1">
            <Button variant="ghost" size="sm" onClick={chooseFile} busy={upload.isPending}>
              <RefreshCw className="size-4" aria-hidden="true" /> Replace image
            </Button>
            <Button variant="ghost" size="sm" onClick={askRemove}>
              <Trash2 className="size-4" aria-hidden="true" /> Remove image
            </Button>
          </div>
        )}
      </div>
      <div className="mb-3 space-y-2">
        <FormError message={error} />
        {progressBar}
      </div>
      {!zones ? (
        <Skeleton className="h-64 w-full" />
      ) : canEdit ? (
        <PinEditor siteId={siteId} floor={floor} floors={floors} zones={zones} src={src} pins={pins} multiplePanels={panels > 1} />
      ) : (
        <PlanView src={src} alt={`Floor plan of ${floor.name}`} pins={pins} />
      )}
      <ConfirmDialog pending={pending} onClose={() => setPending(null)} />
    </div>
  );
}

// ---------------------------------------------------------------------------------------------
// Pin editor
// ---------------------------------------------------------------------------------------------

interface Drag {
  zoneId: string;
  from: 'list' | 'pin';
  pointerId: number;
  startX: number;
  startY: number;
  moved: boolean;
}

interface PinEditorProps {
  siteId: string;
  floor: ApiFloor;
  floors: ApiFloor[];
  zones: ApiPremisesZone[];
  src: string;
  pins: PlanPin[];
  multiplePanels: boolean;
}

const NUDGE = 0.01;
const NUDGE_FAST = 0.05;

function PinEditor({ siteId, floor, floors, zones, src, pins, multiplePanels }: PinEditorProps) {
  const setPin = useSetPin(siteId);
  const clearPin = useClearPin(siteId);
  const toast = useToast();
  const imageRef = useRef<HTMLImageElement>(null);
  const drag = useRef<Drag | null>(null);
  const suppressClick = useRef(false);
  const nudgeTimer = useRef<number | undefined>(undefined);
  const focusPin = useRef<string | null>(null);
  const [selected, setSelected] = useState<string | null>(null);
  const [ghost, setGhost] = useState<{ zoneId: string; x: number; y: number; over: boolean } | null>(null);
  const [moving, setMoving] = useState<{ zoneId: string; x: number; y: number } | null>(null);

  const listed = zones.filter((z) => z.status !== 'removed');
  const byId = new Map(listed.map((z) => [z.id, z]));
  const chosen = selected ? byId.get(selected) : undefined;
  const floorName = (id: string) => floors.find((f) => f.id === id)?.name ?? 'another floor';
  const shown = pins.map((p) => (moving?.zoneId === p.zoneId ? { ...p, x: moving.x, y: moving.y } : p));
  if (moving && !shown.some((p) => p.zoneId === moving.zoneId)) {
    const z = byId.get(moving.zoneId);
    if (z)
      shown.push({
        zoneId: z.id,
        number: z.number,
        description: z.description,
        panelLabel: multiplePanels ? z.panelLabel : undefined,
        x: moving.x,
        y: moving.y,
      });
  }

  /** Where a pointer is on the image, as fractions; `inside` when it is over the image. */
  const fractionAt = (clientX: number, clientY: number) => {
    const rect = imageRef.current?.getBoundingClientRect();
    if (!rect || rect.width === 0 || rect.height === 0) return { x: 0, y: 0, inside: false };
    const x = (clientX - rect.left) / rect.width;
    const y = (clientY - rect.top) / rect.height;
    return { x, y, inside: x >= 0 && x <= 1 && y >= 0 && y <= 1 };
  };

  const place = (zoneId: string, x: number, y: number, { quiet = false } = {}) => {
    const zone = byId.get(zoneId);
    const pin = { floorId: floor.id, x: toFraction(x), y: toFraction(y) };
    setMoving({ zoneId, x: pin.x, y: pin.y });
    setPin.mutate(
      { zoneId, pin },
      {
        onSuccess: () => {
          // a pin moved on its own plan needs no message; one placed here (or brought from another floor) does
          if (quiet || !zone || zone.pin?.floorId === floor.id) return;
          toast.success(`Zone ${zone.number} “${zone.description}” ${zone.pin ? 'moved' : 'placed'} on ${floor.name}.`);
        },
        onError: (err) => toast.error(err instanceof ApiError ? err.message : 'The pin could not be saved. Try again.'),
        onSettled: () => setMoving((m) => (m?.zoneId === zoneId && m.x === pin.x && m.y === pin.y ? null : m)),
      },
    );
  };

  const pointerHandlers = (zoneId: string, from: Drag['from']) => ({
    onPointerDown: (e: React.PointerEvent<HTMLElement>) => {
      if (e.button !== 0) return;
      drag.current = { zoneId, from, pointerId: e.pointerId, startX: e.clientX, startY: e.clientY, moved: false };
      e.currentTarget.setPointerCapture?.(e.pointerId);
    },
    onPointerMove: (e: React.PointerEvent<HTMLElement>) => {
      const d = drag.current;
      if (!d || d.pointerId !== e.pointerId) return;
      if (!d.moved && Math.hypot(e.clientX - d.startX, e.clientY - d.startY) < 5) return;
      d.moved = true;
      const f = fractionAt(e.clientX, e.clientY);
      if (d.from === 'pin') setMoving({ zoneId, x: toFraction(f.x), y: toFraction(f.y) });
      else setGhost({ zoneId, x: e.clientX, y: e.clientY, over: f.inside });
    },
    onPointerUp: (e: React.PointerEvent<HTMLElement>) => {
      const d = drag.current;
      drag.current = null;
      setGhost(null);
      if (!d || d.pointerId !== e.pointerId || !d.moved) return;
      suppressClick.current = true;
      const f = fractionAt(e.clientX, e.clientY);
      if (d.from === 'pin' || f.inside) {
        place(zoneId, f.x, f.y);
        setSelected(null);
      } else setMoving(null);
    },
    onPointerCancel: () => {
      drag.current = null;
      setGhost(null);
      setMoving(null);
    },
  });

  const wasDrag = () => {
    if (!suppressClick.current) return false;
    suppressClick.current = false;
    return true;
  };

  const onPlanClick = (e: React.MouseEvent<HTMLDivElement>) => {
    if (wasDrag() || !selected) return;
    const f = fractionAt(e.clientX, e.clientY);
    if (!f.inside) return;
    place(selected, f.x, f.y);
    setSelected(null);
  };

  const putInMiddle = () => {
    if (!selected) return;
    focusPin.current = selected;
    place(selected, 0.5, 0.5);
    setSelected(null);
  };

  const onPinKey = (pin: PlanPin) => (e: React.KeyboardEvent<HTMLButtonElement>) => {
    const step = e.shiftKey ? NUDGE_FAST : NUDGE;
    const delta: Record<string, [number, number]> = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] };
    const d = delta[e.key];
    if (d) {
      e.preventDefault();
      const x = toFraction(pin.x + d[0]);
      const y = toFraction(pin.y + d[1]);
      setMoving({ zoneId: pin.zoneId, x, y });
      window.clearTimeout(nudgeTimer.current);
      nudgeTimer.current = window.setTimeout(() => place(pin.zoneId, x, y, { quiet: true }), 500);
      return;
    }
    if (e.key === 'Delete' || e.key === 'Backspace') {
      e.preventDefault();
      removePin(pin.zoneId);
    }
  };

  const removePin = (zoneId: string) => {
    const zone = byId.get(zoneId);
    clearPin.mutate(zoneId, {
      onSuccess: () => zone && toast.success(`Pin of zone ${zone.number} taken off the plan.`),
      onError: (err) => toast.error(err instanceof ApiError ? err.message : 'The pin could not be removed. Try again.'),
    });
  };

  const ghostZone = ghost ? byId.get(ghost.zoneId) : undefined;
  const onThisPlan = listed.filter((z) => z.pin?.floorId === floor.id).length;

  return (
    <div
      className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_17rem]"
      onKeyDown={(e) => {
        if (e.key === 'Escape' && selected) {
          e.preventDefault();
          setSelected(null);
        }
      }}
    >
      <div className="min-w-0 space-y-2">
        <div aria-live="polite" className="min-h-10 text-sm">
          {chosen ? (
            <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
              <p className="font-medium text-brass-700">
                Zone {chosen.number} “{chosen.description}”: click or tap the plan where it is.
              </p>
              <span className="flex gap-1">
                <Button variant="secondary" size="sm" onClick={putInMiddle}>
                  Put it in the middle
                </Button>
                <Button variant="ghost" size="sm" onClick={() => setSelected(null)}>
                  Cancel
                </Button>
              </span>
            </div>
          ) : (
            <p className="text-slate-500">
              Drag a zone from the list onto the plan, or choose one and then click or tap the plan. Drag a pin, or focus it and use the arrow keys,
              to move it.
            </p>
          )}
        </div>
        <PlanFrame
          src={src}
          alt={`Floor plan of ${floor.name}`}
          imageRef={imageRef}
          onClick={onPlanClick}
          className={cn((chosen || ghost?.over) && 'cursor-crosshair rounded-md ring-2 ring-brass-600 ring-offset-2')}
        >
          {shown.map((pin) => (
            <button
              key={pin.zoneId}
              type="button"
              ref={(el) => {
                if (el && focusPin.current === pin.zoneId) {
                  focusPin.current = null;
                  el.focus();
                }
              }}
              aria-label={`${pinLabel(pin)}. Drag it, or use the arrow keys, to move it; Delete takes it off the plan.`}
              className={cn(
                PIN_CLASS,
                'cursor-grab touch-none active:cursor-grabbing',
                moving?.zoneId === pin.zoneId ? 'bg-brass-600 text-white' : 'bg-ink text-paper',
              )}
              style={{ left: percent(pin.x), top: percent(pin.y) }}
              {...pointerHandlers(pin.zoneId, 'pin')}
              onClick={(e) => {
                e.stopPropagation();
                wasDrag();
              }}
              onKeyDown={onPinKey(pin)}
            >
              <span aria-hidden="true">{pin.number}</span>
              <PinTooltip pin={pin} />
            </button>
          ))}
        </PlanFrame>
      </div>

      <div className="min-w-0">
        <div className="mb-2 flex items-baseline justify-between gap-2">
          <h4 className="text-sm font-semibold">Zones</h4>
          <p className="text-xs text-slate-500">
            {onThisPlan} of {listed.length} on this plan
          </p>
        </div>
        {listed.length === 0 ? (
          <p className="text-sm text-slate-500">This site has no zones yet. Enrol them on the panel, then place them here.</p>
        ) : (
          <ul
            className="max-h-[28rem] divide-y divide-line overflow-y-auto rounded-md border border-line"
            aria-label={`Zones to place on ${floor.name}`}
          >
            {listed.map((z) => {
              const where = z.pin ? (z.pin.floorId === floor.id ? 'On this plan' : `On ${floorName(z.pin.floorId)}`) : 'Not placed';
              const isChosen = selected === z.id;
              const handlers = pointerHandlers(z.id, 'list');
              return (
                <li key={z.id} className={cn('flex items-center gap-1 pr-1', isChosen && 'bg-brass-50')}>
                  <span
                    className="flex h-11 w-7 shrink-0 cursor-grab touch-none items-center justify-center text-slate-500 active:cursor-grabbing"
                    aria-hidden="true"
                    {...handlers}
                  >
                    <GripVertical className="size-4" />
                  </span>
                  <button
                    type="button"
                    aria-pressed={isChosen}
                    aria-label={`Place zone ${z.number} ${z.description}`}
                    className="flex min-h-11 min-w-0 flex-1 cursor-grab items-center gap-2 py-1.5 text-left active:cursor-grabbing"
                    onPointerDown={(e) => e.pointerType !== 'touch' && handlers.onPointerDown(e)}
                    onPointerMove={handlers.onPointerMove}
                    onPointerUp={handlers.onPointerUp}
                    onPointerCancel={handlers.onPointerCancel}
                    onClick={() => {
                      if (wasDrag()) return;
                      setSelected(isChosen ? null : z.id);
                    }}
                  >
                    <span
                      className={cn(
                        'flex size-6 shrink-0 items-center justify-center rounded-full text-xs font-semibold tabular-nums',
                        isChosen ? 'bg-brass-600 text-white' : 'bg-ink text-paper',
                      )}
                    >
                      {z.number}
                    </span>
                    <span className="min-w-0">
                      <span className="block truncate text-sm">{z.description}</span>
                      <span className={cn('block text-xs', z.pin?.floorId === floor.id ? 'text-sage-600' : 'text-slate-500')}>
                        {multiplePanels ? `${z.panelLabel} · ` : ''}
                        {isChosen ? 'Chosen: now the plan' : where}
                      </span>
                    </span>
                  </button>
                  {z.pin?.floorId === floor.id && (
                    <IconButton label={`Take zone ${z.number} off the plan`} onClick={() => removePin(z.id)}>
                      <X className="size-4" aria-hidden="true" />
                    </IconButton>
                  )}
                </li>
              );
            })}
          </ul>
        )}
      </div>

      {ghost && ghostZone && (
        <span
          aria-hidden="true"
          className={cn(
            'pointer-events-none fixed z-50 flex size-8 -translate-x-1/2 -translate-y-1/2 items-center justify-center rounded-full border-2 border-white text-xs font-semibold shadow-dialog',
            ghost.over ? 'bg-brass-600 text-white' : 'bg-slate-500 text-white',
          )}
          style={{ left: ghost.x, top: ghost.y }}
        >
          {ghostZone.number}
        </span>
      )}
    </div>
  );
}
