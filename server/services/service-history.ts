/**
 * A site's service history: completed and cancelled jobs, the
 * zone change log of the site's panels and the panel programming records, newest first, each
 * entry `{ type, at, title, detail, link: { kind, id } }`. Paged by merging the newest rows of
 * each source, so a page never reads more than page × size rows per source.
 */
import { Op, fn, col } from 'sequelize';
import { JOB_KIND_LABELS } from '@domain/jobs';
import { type Ctx, scoped } from '../context';
import { Job } from '../models/Job';
import { Panel } from '../models/Panel';
import { User } from '../models/User';
import { Zone } from '../models/Zone';
import { ZoneChange } from '../models/ZoneChange';

export const HISTORY_TYPES = ['job', 'zone_change', 'programming'] as const;
export type HistoryType = (typeof HISTORY_TYPES)[number];

export interface HistoryEntry {
  id: string;
  type: HistoryType;
  at: Date;
  title: string;
  detail: string;
  link: { kind: 'job' | 'zone' | 'panel'; id: string };
}

const NONE = '—';

/** "batteryChangedOn" → "battery changed on"; "settings.exitDelaySec" → "exit delay sec". */
export function fieldWords(field: string): string {
  const last = field.split('.').pop() ?? field;
  return last.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
}

function valueText(value: unknown): string {
  if (value === null || value === undefined || value === '') return NONE;
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'string' || typeof value === 'number') return String(value);
  return JSON.stringify(value);
}

/** "battery changed on: 2025-01-04 → 2026-12-03; chime: yes → no" */
export function changesText(changes: Record<string, [unknown, unknown]> | null | undefined): string {
  return Object.entries(changes ?? {})
    .map(([field, [from, to]]) => `${fieldWords(field)}: ${valueText(from)} → ${valueText(to)}`)
    .join('; ');
}

const ZONE_ACTION_WORDS: Record<ZoneChange['action'], string> = {
  created: 'added',
  updated: 'changed',
  removed: 'removed',
  deleted: 'deleted',
  imported: 'imported',
  programmed: 'programmed',
};

export interface HistoryPage {
  entries: HistoryEntry[];
  total: number;
}

/** One page of a site's history, newest first; `type` keeps one kind of entry. */
export async function siteHistory(ctx: Ctx, siteId: string, options: { type?: HistoryType | undefined; page: number; pageSize: number }): Promise<HistoryPage> {
  const want = (type: HistoryType) => !options.type || options.type === type;
  const limit = options.page * options.pageSize;
  const transaction = ctx.transaction ?? null;

  const panels = await Panel.findAll({ where: scoped(ctx, { siteId }), attributes: ['id', 'label'], transaction });
  const panelLabel = new Map(panels.map((p) => [p.id, p.label]));
  const panelIds = panels.map((p) => p.id);

  const entries: HistoryEntry[] = [];
  let total = 0;

  if (want('job')) {
    const closedAt = fn('COALESCE', col('completedAt'), col('updatedAt'));
    const where = scoped(ctx, { siteId, state: { [Op.in]: ['completed', 'cancelled'] } });
    const [jobs, count] = await Promise.all([
      Job.findAll({
        where,
        order: [
          [closedAt, 'DESC'],
          ['id', 'ASC'],
        ],
        limit,
        transaction,
      }),
      Job.count({ where, transaction }),
    ]);
    total += count;
    const userIds = [...new Set(jobs.flatMap((j) => [j.technicianId, j.completedById]).filter((id): id is string => Boolean(id)))];
    const users = userIds.length ? await User.findAll({ where: scoped(ctx, { id: { [Op.in]: userIds } }), attributes: ['id', 'name'], transaction }) : [];
    const nameOf = (id: string | null | undefined) => (id ? users.find((u) => u.id === id)?.name : undefined);
    for (const job of jobs) {
      const kind = JOB_KIND_LABELS[job.kind];
      if (job.state === 'completed') {
        const who = nameOf(job.technicianId) ?? nameOf(job.completedById);
        const parts = [who ? `Technician: ${who}.` : '', job.clientNotes?.trim() ? job.clientNotes.trim() : ''].filter(Boolean);
        entries.push({
          id: `job:${job.id}`,
          type: 'job',
          at: job.completedAt ?? job.updatedAt,
          title: `${kind} completed: ${job.summary}`,
          detail: parts.join(' '),
          link: { kind: 'job', id: job.id },
        });
      } else {
        entries.push({
          id: `job:${job.id}`,
          type: 'job',
          at: job.updatedAt,
          title: `${kind} cancelled: ${job.summary}`,
          detail: job.cancelReason ? `Reason: ${job.cancelReason}` : '',
          link: { kind: 'job', id: job.id },
        });
      }
    }
  }

  const changeSources: [HistoryType, object][] = [];
  if (want('zone_change')) changeSources.push(['zone_change', { action: { [Op.ne]: 'programmed' } }]);
  if (want('programming')) changeSources.push(['programming', { action: 'programmed' }]);
  if (panelIds.length > 0) {
    for (const [type, condition] of changeSources) {
      const where = scoped(ctx, { panelId: { [Op.in]: panelIds }, ...condition });
      const [rows, count] = await Promise.all([
        ZoneChange.findAll({
          where,
          order: [
            ['createdAt', 'DESC'],
            ['zoneNumber', 'ASC'],
            ['id', 'ASC'],
          ],
          limit,
          transaction,
        }),
        ZoneChange.count({ where, transaction }),
      ]);
      total += count;
      const zoneIds = [...new Set(rows.map((r) => r.zoneId).filter((id): id is string => Boolean(id)))];
      const zones = zoneIds.length ? await Zone.findAll({ where: scoped(ctx, { id: { [Op.in]: zoneIds } }), attributes: ['id', 'description'], transaction }) : [];
      const descriptionOf = new Map(zones.map((z) => [z.id, z.description]));
      for (const row of rows) {
        const label = panelLabel.get(row.panelId) ?? 'panel';
        const by = row.actorName ? ` By ${row.actorName}.` : '';
        if (type === 'programming') {
          entries.push({
            id: `change:${row.id}`,
            type,
            at: row.createdAt,
            title: `Panel “${label}” programmed`,
            detail: `Recorded as programmed.${by}`.trim(),
            link: { kind: 'panel', id: row.panelId },
          });
          continue;
        }
        const described = row.changes?.description?.[0] ?? row.changes?.description?.[1];
        const description = (row.zoneId ? descriptionOf.get(row.zoneId) : undefined) ?? (typeof described === 'string' ? described : undefined);
        const title =
          row.zoneNumber !== null
            ? `Zone ${row.zoneNumber}${description ? ` “${description}”` : ''} ${ZONE_ACTION_WORDS[row.action]} on “${label}”`
            : `Panel “${label}” settings ${ZONE_ACTION_WORDS[row.action]}`;
        entries.push({
          id: `change:${row.id}`,
          type,
          at: row.createdAt,
          title,
          detail: `${changesText(row.changes)}${by ? `.${by}` : ''}`.replace(/^\.\s*/, ''),
          link: row.zoneId && row.action !== 'deleted' ? { kind: 'zone', id: row.zoneId } : { kind: 'panel', id: row.panelId },
        });
      }
    }
  }

  entries.sort((a, b) => b.at.getTime() - a.at.getTime() || a.id.localeCompare(b.id));
  const offset = (options.page - 1) * options.pageSize;
  return { entries: entries.slice(offset, offset + options.pageSize), total };
}
