/**
 * A panel's zone list as CSV (api-resources.md: the column headers are the JSON field names,
 * ZONE_CSV_COLUMNS). Booleans are `true`/`false`, dates `YYYY-MM-DD`, an empty value an empty
 * cell, and the serial is written as the string it is (leading zeros kept, no ="…" wrapping).
 * The export round-trips exactly through the import (zone-import.ts).
 */
import Papa from 'papaparse';
import { type ZoneStatus } from '@domain/devices';
import { ZONE_CSV_COLUMNS, type ZoneValues } from '@domain/schemas/zone';
import type { Zone } from '../models/Zone';
import { zoneValuesOf } from './zones';

export type ZoneCsvColumn = (typeof ZONE_CSV_COLUMNS)[number];

/** The free-text columns: the only ones whose cells can start with a spreadsheet formula character. */
export const FREE_TEXT_COLUMNS: readonly ZoneCsvColumn[] = ['description', 'serial', 'batteryType'];

/**
 * Guards against formula injection when the file is opened in a spreadsheet: a cell that
 * starts with = + - @ (or tab/CR), possibly after apostrophes, gets one more apostrophe in
 * front. `unescapeCsvText` takes exactly that apostrophe off again, so every value survives
 * the round trip; a value that does not look like a formula is written as it is.
 */
const FORMULA_START = /^'*[=+\-@\t\r]/;
export function escapeCsvText(value: string): string {
  return FORMULA_START.test(value) ? `'${value}` : value;
}
export function unescapeCsvText(value: string): string {
  return /^'+[=+\-@\t\r]/.test(value) ? value.slice(1) : value;
}

/** One cell as text. */
function cellOf(column: ZoneCsvColumn, value: ZoneValues[ZoneCsvColumn]): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  if (typeof value === 'number') return String(value);
  return FREE_TEXT_COLUMNS.includes(column) ? escapeCsvText(value) : value;
}

const STATUS_RANK: Record<ZoneStatus, number> = { active: 0, bypassed: 1, removed: 2 };

/**
 * The CSV text of a zone list, ordered by zone number (a removed zone after the zone now
 * holding its number; ties by the row's own text, so the order depends only on the content).
 */
export function zonesToCsv(zones: readonly Zone[]): string {
  const rows = zones.map((zone) => {
    const values = zoneValuesOf(zone);
    const cells = ZONE_CSV_COLUMNS.map((column) => cellOf(column, values[column]));
    return { number: values.number, rank: STATUS_RANK[values.status], cells, key: cells.join('\u0000') };
  });
  rows.sort((a, b) => a.number - b.number || a.rank - b.rank || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  const text = Papa.unparse({ fields: [...ZONE_CSV_COLUMNS], data: rows.map((r) => r.cells) }, { newline: '\r\n', escapeFormulae: false });
  return `${text}\r\n`;
}

/** A download's file name from a panel label: ("zones", "Main panel", "csv") → "zones-main-panel.csv". */
export function downloadName(prefix: string, label: string, extension: string): string {
  const slug =
    label
      .normalize('NFKD')
      .replace(/[^\w\s-]/g, '')
      .trim()
      .toLowerCase()
      .replace(/[\s_-]+/g, '-')
      .slice(0, 60) || 'panel';
  return `${prefix}-${slug}.${extension}`;
}
