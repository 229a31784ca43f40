/**
 * Importing a panel's zone list from CSV (papaparse), all or nothing.
 *
 * What an import does — it ADDS and UPDATES, it never deletes: each row is matched to the
 * panel's zones by zone number. A row whose number belongs to a zone in use (active or
 * bypassed) updates that zone; any other row creates a zone. Zones the file does not mention
 * stay as they are (to take a zone out, give its row the status `removed`). A `removed` row is
 * history: it updates the zone in use with that number when no other row claims the number
 * (that removes it), else the removed zone with the same number, serial and input, else it is
 * added as a removed zone — so importing a file exported from this panel changes nothing, and
 * importing it into an empty panel reproduces it exactly.
 *
 * Columns are ZONE_CSV_COLUMNS (the JSON field names, in any order, any letter case); every
 * column but `description` and `deviceType` may be left out. For a new zone a missing column or
 * an empty cell takes the default: the next free wireless number, the device type's zone type
 * and switches, input 1, status active, no serial, no dates. For an updated zone a missing
 * column keeps the zone's value; an empty cell clears it (the switches and zone type go back
 * to the device type's defaults).
 *
 * Every row is checked — the schema, duplicate numbers and serial+input within the file, and
 * clashes with the panel's zones as they will be after the import — and every error is
 * reported keyed `rows.<n>.<field>` (n = data row, counting from 1 below the header). Nothing
 * is saved unless the whole file is valid.
 */
import Papa from 'papaparse';
import { ZONE_CSV_COLUMNS, zoneCreateSchema, type ZoneValues } from '@domain/schemas/zone';
import {
  type ChangeSet,
  type PanelRange,
  type ZoneLike,
  type ZoneProblem,
  marksPanelChanged,
  nextFreeZoneNumber,
  zoneChangeSet,
  zoneDefaultsFor,
  zoneProblems,
  zoneWarnings,
} from '@domain/zones';
import type { Ctx } from '../context';
import { errors } from '../errors';
import { fieldsFromZod } from '../middlewares/validate';
import type { Panel } from '../models/Panel';
import { Zone } from '../models/Zone';
import { recordAudit } from './audit-recorder';
import { FREE_TEXT_COLUMNS, type ZoneCsvColumn, unescapeCsvText } from './zone-export';
import {
  type ZoneCreateValues,
  ZONE_LOGGED_FIELDS,
  completeZoneValues,
  logZoneChange,
  panelFullMessage,
  panelRangeOf,
  panelZones,
  reloadPanel,
  zoneValuesOf,
} from './zones';

/** More rows than any panel holds (999 zones plus removed history); beyond this the file is refused. */
export const MAX_IMPORT_ROWS = 5000;
const REQUIRED_COLUMNS: readonly ZoneCsvColumn[] = ['description', 'deviceType'];
const BEHAVIOUR_COLUMNS = ['zoneType', 'reportsToMonitoring', 'chime', 'supervised'] as const;
const NUMBER_COLUMNS: readonly ZoneCsvColumn[] = ['number', 'input'];
const BOOLEAN_COLUMNS: readonly ZoneCsvColumn[] = ['reportsToMonitoring', 'chime', 'supervised'];
const NULLABLE_COLUMNS: readonly ZoneCsvColumn[] = ['installedOn', 'batteryType', 'batteryChangedOn', 'manufacturedOn'];

/** A data row that passed the schema: what it says, and which columns the file has. */
export interface ParsedZoneRow {
  row: number;
  input: ZoneCreateValues;
  columns: ReadonlySet<ZoneCsvColumn>;
}

export interface ImportRow {
  row: number;
  action: 'create' | 'update' | 'unchanged';
  zoneId: string | null;
  values: ZoneValues;
  changes: ChangeSet;
  warnings: ZoneProblem[];
}

export interface ImportPlan {
  rows: ImportRow[];
  creates: number;
  updates: number;
  unchanged: number;
}

type Fields = Record<string, string>;

function fileError(message: string): never {
  throw errors.validation(message, { file: message });
}

/** The line (from 1) of a character offset, for quote errors that papaparse cannot pin to a row. */
function lineOf(text: string, index: number): number {
  let line = 1;
  for (let i = 0; i < index && i < text.length; i++) if (text[i] === '\n') line++;
  return line;
}

/** A cell as the schema expects it: numbers and booleans typed, empty cells left out or null; else the text, for the schema to refuse. */
function valueOf(column: ZoneCsvColumn, cell: string): unknown {
  const trimmed = cell.trim();
  if (NUMBER_COLUMNS.includes(column)) {
    if (trimmed === '') return undefined;
    return /^[+-]?\d+$/.test(trimmed) ? Number(trimmed) : trimmed;
  }
  if (BOOLEAN_COLUMNS.includes(column)) {
    const word = trimmed.toLowerCase();
    if (word === '') return undefined;
    if (['true', 'yes', 'y', '1', 'on'].includes(word)) return true;
    if (['false', 'no', 'n', '0', 'off'].includes(word)) return false;
    return trimmed;
  }
  if (NULLABLE_COLUMNS.includes(column)) {
    if (trimmed === '') return null;
    return column === 'batteryType' ? unescapeCsvText(cell) : trimmed;
  }
  if (FREE_TEXT_COLUMNS.includes(column)) return unescapeCsvText(cell);
  // deviceType, zoneType, status: keys; an empty cell takes the default
  return trimmed === '' ? undefined : trimmed;
}

/**
 * Reads the CSV text: file-level problems (no header, unknown or missing columns, broken
 * quotes, too many rows) throw at once; each data row is checked against the zone schema and
 * its errors collected as `rows.<n>.<field>`.
 */
export function parseZoneCsv(text: string): { rows: ParsedZoneRow[]; fields: Fields } {
  const source = text.replace(/^\uFEFF/, '');
  const parsed = Papa.parse<string[]>(source, { header: false, skipEmptyLines: 'greedy', delimitersToGuess: [',', ';', '\t'] });
  const quoteError = parsed.errors.find((e) => e.type === 'Quotes');
  if (quoteError) fileError(`The file has an unclosed or stray quote mark near line ${lineOf(source, quoteError.index ?? 0)}. Check that line and save the file as CSV again.`);
  const [header, ...data] = parsed.data;
  if (!header || header.every((h) => h.trim() === '')) fileError(`The file is empty. The first line names the columns: ${ZONE_CSV_COLUMNS.join(', ')}.`);
  if (data.length === 0) fileError('The file has a header line but no zones below it.');
  if (data.length > MAX_IMPORT_ROWS) fileError(`The file has ${data.length} rows; an import takes at most ${MAX_IMPORT_ROWS}.`);

  const known = new Map(ZONE_CSV_COLUMNS.map((c) => [c.toLowerCase(), c]));
  const columns: (ZoneCsvColumn | null)[] = [];
  const unknown: string[] = [];
  for (const raw of header) {
    const name = raw.trim();
    const column = known.get(name.toLowerCase()) ?? null;
    if (name === '' && data.every((cells) => (cells[columns.length] ?? '').trim() === '')) {
      columns.push(null); // a trailing empty column some spreadsheets add
      continue;
    }
    if (!column) unknown.push(name === '' ? '(a column with no name)' : `“${name}”`);
    else if (columns.includes(column)) fileError(`The column ${column} appears twice in the header line.`);
    columns.push(column);
  }
  if (unknown.length > 0) fileError(`Unknown column ${unknown.join(', ')}. Use the columns ${ZONE_CSV_COLUMNS.join(', ')}.`);
  const present = new Set(columns.filter((c): c is ZoneCsvColumn => c !== null));
  const missing = REQUIRED_COLUMNS.filter((c) => !present.has(c));
  if (missing.length > 0) fileError(`The file needs the column${missing.length > 1 ? 's' : ''} ${missing.join(' and ')}.`);

  const rows: ParsedZoneRow[] = [];
  const fields: Fields = {};
  data.forEach((cells, index) => {
    const row = index + 1;
    const extra = cells.slice(columns.length);
    if (extra.some((cell) => cell.trim() !== '')) {
      fields[`rows.${row}`] = `Row ${row} has ${cells.length} cells; the header names ${columns.length} columns.`;
      return;
    }
    const record: Record<string, unknown> = {};
    columns.forEach((column, i) => {
      if (!column) return;
      const value = valueOf(column, cells[i] ?? '');
      if (value !== undefined) record[column] = value;
    });
    const result = zoneCreateSchema.safeParse(record);
    if (!result.success) {
      for (const [path, message] of Object.entries(fieldsFromZod(result.error))) fields[`rows.${row}.${path}`] ??= message;
      return;
    }
    rows.push({ row, input: result.data, columns: present });
  });
  return { rows, fields };
}

/** An existing zone's values with what the row says (only the columns the file has). */
function updatedValues(current: ZoneValues, parsed: ParsedZoneRow): ZoneValues {
  const next: ZoneValues = { ...current };
  const set = next as unknown as Record<string, unknown>;
  const input = parsed.input as unknown as Record<string, unknown>;
  for (const column of parsed.columns) {
    if ((BEHAVIOUR_COLUMNS as readonly string[]).includes(column)) continue;
    set[column] = input[column];
  }
  const defaults = zoneDefaultsFor(next.deviceType);
  for (const column of BEHAVIOUR_COLUMNS) {
    if (!parsed.columns.has(column)) continue;
    set[column] = input[column] ?? defaults[column];
  }
  return next;
}

interface Existing {
  id: string;
  values: ZoneValues;
}

/**
 * Works out what each row does against the panel's zones (see the file comment), checks the
 * panel as it will be after the import, and collects every error keyed `rows.<n>.<field>`.
 */
export function planZoneImport(parsedRows: readonly ParsedZoneRow[], panel: PanelRange, zones: readonly Zone[]): { plan: ImportPlan; fields: Fields } {
  const fields: Fields = {};
  const fail = (row: number, field: string, message: string) => {
    fields[`rows.${row}.${field}`] ??= message;
  };
  const existing: Existing[] = zones.map((z) => ({ id: z.id, values: zoneValuesOf(z) }));
  const inUseByNumber = new Map(existing.filter((e) => e.values.status !== 'removed').map((e) => [e.values.number, e]));
  const isRemovedRow = (r: ParsedZoneRow) => r.input.status === 'removed';

  // A zone number in use may appear on one row only.
  const claimedBy = new Map<number, number>();
  for (const r of parsedRows) {
    const n = r.input.number;
    if (n === undefined || isRemovedRow(r)) continue;
    const first = claimedBy.get(n);
    if (first !== undefined) fail(r.row, 'number', `Zone ${n} is also on row ${first} of this file. A zone number may appear on one row only.`);
    else claimedBy.set(n, r.row);
  }

  // Which existing zone each numbered row updates (none: the row creates a zone).
  const targeted = new Set<string>();
  const targetOf = new Map<number, Existing | null>();
  for (const r of parsedRows) {
    const n = r.input.number;
    if (n === undefined) continue;
    let target: Existing | undefined;
    if (!isRemovedRow(r)) target = inUseByNumber.get(n);
    else {
      const inUse = claimedBy.has(n) ? undefined : inUseByNumber.get(n);
      target =
        inUse && !targeted.has(inUse.id)
          ? inUse
          : existing.find(
              (e) =>
                e.values.status === 'removed' &&
                e.values.number === n &&
                e.values.serial === r.input.serial &&
                e.values.input === r.input.input &&
                !targeted.has(e.id),
            );
    }
    if (target && targeted.has(target.id)) target = undefined; // a second row for the same zone: already refused above
    if (target) targeted.add(target.id);
    targetOf.set(r.row, target ?? null);
  }

  // The panel as it will be: untouched zones, then each row in file order.
  const state: ZoneLike[] = existing.filter((e) => !targeted.has(e.id)).map((e) => likeOf(e.id, e.values));
  const planned: { parsed: ParsedZoneRow; target: Existing | null; values: ZoneValues }[] = [];
  for (const r of parsedRows) {
    if (r.input.number === undefined) continue;
    const target = targetOf.get(r.row) ?? null;
    const values = target ? updatedValues(target.values, r) : completeZoneValues(r.input, r.input.number);
    planned.push({ parsed: r, target, values });
    state.push(likeOf(target?.id ?? rowId(r.row), values));
  }
  // Rows without a number take the next free wireless number, in file order.
  for (const r of parsedRows) {
    if (r.input.number !== undefined) continue;
    const number = nextFreeZoneNumber(panel, state);
    if (number === null) {
      fail(r.row, 'number', panelFullMessage(panel));
      continue;
    }
    const values = completeZoneValues(r.input, number);
    planned.push({ parsed: r, target: null, values });
    state.push(likeOf(rowId(r.row), values));
  }
  planned.sort((a, b) => a.parsed.row - b.parsed.row);

  const rows: ImportRow[] = [];
  for (const { parsed, target, values } of planned) {
    const id = target?.id ?? rowId(parsed.row);
    const candidate = { id, number: values.number, serial: values.serial, input: values.input };
    if (values.status !== 'removed') {
      for (const problem of zoneProblems(candidate, panel, state)) {
        // a clash between two rows of the file is reported on the later row, naming the earlier
        if (rowOfId(problem.clashZoneId) > parsed.row) continue;
        fail(parsed.row, problem.field, rowMessage(problem, values));
      }
    }
    const changes = zoneChangeSet(target?.values ?? {}, values, ZONE_LOGGED_FIELDS);
    const action = !target ? 'create' : Object.keys(changes).length === 0 ? 'unchanged' : 'update';
    rows.push({ row: parsed.row, action, zoneId: target?.id ?? null, values, changes, warnings: values.status === 'removed' ? [] : zoneWarnings(candidate, panel) });
  }
  const count = (action: ImportRow['action']) => rows.filter((r) => r.action === action).length;
  return { plan: { rows, creates: count('create'), updates: count('update'), unchanged: count('unchanged') }, fields };
}

const ROW_ID = 'row:';
const rowId = (row: number) => `${ROW_ID}${row}`;
/** The file row a planned zone id stands for; 0 for a saved zone. */
const rowOfId = (id: string | undefined) => (id?.startsWith(ROW_ID) ? Number(id.slice(ROW_ID.length)) : 0);

function likeOf(id: string, values: ZoneValues): ZoneLike {
  return { id, number: values.number, serial: values.serial, input: values.input, status: values.status, description: values.description };
}

/** The domain's message, or — when the clash is with another row of the file — one that names that row. */
function rowMessage(problem: ZoneProblem, values: ZoneValues): string {
  if (!problem.clashZoneId?.startsWith(ROW_ID)) return problem.message;
  const other = problem.clashZoneId.slice(ROW_ID.length);
  if (problem.code === 'zone_number_taken') return `Zone ${values.number} is also on row ${other} of this file. A zone number may appear on one row only.`;
  return `Serial ${values.serial} input ${values.input} is also on row ${other} of this file. Each device input is enrolled once.`;
}

/** "2 rows have errors; nothing was imported. Row 3, serial: …" */
function summaryOf(fields: Fields): string {
  const rows = new Set(Object.keys(fields).map((key) => key.split('.')[1]));
  const [firstKey, firstMessage] = Object.entries(fields)[0] ?? ['', ''];
  const [, row, field] = firstKey.split('.');
  const counted = rows.size === 1 ? '1 row has errors' : `${rows.size} rows have errors`;
  return `${counted}; nothing was imported. Row ${row}${field ? `, ${field}` : ''}: ${firstMessage}`;
}

export interface ImportResult {
  dryRun: boolean;
  plan: ImportPlan;
}

/**
 * Imports a zone list into a panel (call inside a transaction). Throws 400 with every row's
 * errors when any row is bad; a dry run stops after the checks and saves nothing.
 */
export async function importZones(ctx: Ctx, panelId: string, text: string, { dryRun }: { dryRun: boolean }): Promise<ImportResult> {
  const panel = await reloadPanel(ctx, panelId);
  const zones = await panelZones(ctx, panel.id);
  const parsed = parseZoneCsv(text);
  const { plan, fields } = planZoneImport(parsed.rows, panelRangeOf(panel), zones);
  const allFields = sortFields({ ...parsed.fields, ...fields });
  if (Object.keys(allFields).length > 0) throw errors.validation(summaryOf(allFields), allFields);
  if (!dryRun) await applyZoneImport(ctx, panel, zones, plan);
  return { dryRun, plan };
}

/** Errors in row order, then field order as found. */
function sortFields(fields: Fields): Fields {
  const rowOf = (key: string) => Number(key.split('.')[1] ?? 0);
  return Object.fromEntries(Object.entries(fields).sort(([a], [b]) => rowOf(a) - rowOf(b)));
}

/** Writes the plan: creates and updates, one 'imported' change-log row per changed zone, one audit event. */
async function applyZoneImport(ctx: Ctx, panel: Panel, zones: readonly Zone[], plan: ImportPlan): Promise<void> {
  const transaction = ctx.transaction ?? null;
  const byId = new Map(zones.map((z) => [z.id, z]));
  for (const row of plan.rows) {
    if (row.action === 'unchanged') continue;
    let zone = row.zoneId ? byId.get(row.zoneId) : undefined;
    if (zone) await zone.update(row.values, { transaction });
    else zone = await Zone.create({ ...row.values, tenantId: panel.tenantId, siteId: panel.siteId, panelId: panel.id }, { transaction });
    // a zone that was removed and stays removed is not programmed: editing it changes nothing on the panel
    const staysRemoved = row.values.status === 'removed' && (row.action === 'create' || row.changes.status === undefined);
    await logZoneChange(ctx, panel, {
      zoneId: zone.id,
      zoneNumber: row.values.number,
      action: 'imported',
      changes: row.changes,
      marksPanel: !staysRemoved && marksPanelChanged(row.changes),
    });
  }
  await recordAudit(ctx, {
    action: 'zones.imported',
    subjectType: 'Panel',
    subjectId: panel.id,
    details: { rows: plan.rows.length, creates: plan.creates, updates: plan.updates, unchanged: plan.unchanged },
  });
}
