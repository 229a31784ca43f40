import { AlertTriangle } from 'lucide-react';
import { JOB_STATE_LABELS, type JobState } from '@domain/jobs';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import type { ApiUser } from '@/types/api';

export const STATE_TONES: Record<JobState, BadgeTone> = {
  requested: 'warn',
  scheduled: 'neutral',
  in_progress: 'brass',
  completed: 'ok',
  cancelled: 'bad',
};

/** A job's state: always the word, the colour only helps. */
export function JobStateBadge({ state }: { state: JobState }) {
  return <Badge tone={STATE_TONES[state]}>{JOB_STATE_LABELS[state]}</Badge>;
}

/** Another open job of the same technician at the same time. */
export function OverlapFlag({ count, compact = false }: { count: number; compact?: boolean }) {
  if (count <= 0) return null;
  return (
    <Badge tone="bad">
      <AlertTriangle className="size-3.5" aria-hidden="true" />
      {compact ? 'Overlap' : count === 1 ? 'Overlaps another job' : `Overlaps ${count} jobs`}
    </Badge>
  );
}

/** Options for a technician select: the firm's technicians, plus the assigned person if they are not one. */
export function technicianOptions(technicians: readonly ApiUser[] | undefined, assigned?: { id: string | null; name: string | null }) {
  const options = (technicians ?? []).map((t) => ({ id: t.id, name: t.name }));
  if (assigned?.id && !options.some((o) => o.id === assigned.id)) options.unshift({ id: assigned.id, name: assigned.name ?? 'Assigned person' });
  return options;
}

/** "$12.50 × 2" totals: integer cents throughout. */
export function partsTotalCents(parts: readonly { quantity: number | null | undefined; unitPriceCents: number | null | undefined }[]): number {
  return parts.reduce((sum, p) => sum + (p.quantity ?? 0) * (p.unitPriceCents ?? 0), 0);
}

/** One line of an address, for a maps search and a heading. */
export function addressLine(a: { line1: string; line2: string; city: string; region: string; postalCode: string } | undefined): string {
  if (!a) return '';
  return [a.line1, a.line2, a.city, [a.region, a.postalCode].filter(Boolean).join(' ')].filter((s) => s && s.trim()).join(', ');
}

export function mapsUrl(address: string): string {
  return `https://www.openstreetmap.org/search?query=${encodeURIComponent(address)}`;
}
