/**
 * The printable programming sheet of a panel (PDF, pdfkit): firm, site, panel, the CP-01
 * settings with their findings, then every zone in service — zone, input, serial,
 * description, device type, zone type, switches, location, status — on landscape Letter
 * pages that repeat the table's header row. Fonts are the app's own IBM Plex, embedded from
 * the @fontsource packages as .woff (pdfkit cannot read .woff2).
 *
 * `buildProgrammingSheet` also returns every line of text it wrote, so tests can check the
 * content without decompressing the PDF.
 */
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { type PanelSettings } from '@domain/cp01';
import { severityWord, type Severity } from '@domain/severity';
import { COMM_PATH_LABELS, type CommPath, DEVICE_TYPE_LABELS, ZONE_STATUS_LABELS, ZONE_TYPE_LABELS } from '@domain/devices';
import { type ZoneValues } from '@domain/schemas/zone';

const require = createRequire(import.meta.url);
const FONTS = {
  sans: require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff'),
  sansBold: require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-600-normal.woff'),
  mono: require.resolve('@fontsource/ibm-plex-mono/files/ibm-plex-mono-latin-400-normal.woff'),
} as const;

export interface ProgrammingSheetData {
  firmName: string;
  site: { name: string; addressLines: string[]; timeZone: string };
  panel: {
    label: string;
    makeModel: string;
    commPath: CommPath;
    installedOn: string | null;
    zoneCapacity: number;
    wirelessZoneFrom: number;
    wirelessZoneTo: number;
    programmedAt: Date | null;
    changedSinceProgrammed: boolean;
  };
  settings: PanelSettings;
  /** every finding on the panel (CP-01, life-safety zone types, standby battery, path) */
  findings: readonly { severity: Severity; clause: string; message: string }[];
  /** the zones to list, in order (the caller leaves out removed zones), each with where it is, if known */
  zones: readonly SheetZone[];
  generatedAt: Date;
}

/** A zone on the sheet: its values and the room or opening it protects (null until premises are linked). */
export type SheetZone = ZoneValues & { location: string | null };

export interface ProgrammingSheet {
  pdf: Buffer;
  /** every piece of text written, in order */
  lines: string[];
  pages: number;
}

const NONE = '—';
const PAGE = { size: 'LETTER', layout: 'landscape', margin: 36 } as { size: string; layout: 'landscape'; margin: number };
const INK = '#1f1c17';
const MUTED = '#5f584d';
const RULE = '#c9c1b4';
const BAND = '#f1ede6';

/** The settings in form order, with their labels and units. */
const SETTING_ROWS: { key: keyof PanelSettings; label: string; unit?: string }[] = [
  { key: 'exitDelaySec', label: 'Exit delay', unit: 's' },
  { key: 'entryDelaySec', label: 'Entry delay', unit: 's' },
  { key: 'entryDelay2Sec', label: 'Second entry delay', unit: 's' },
  { key: 'abortWindowSec', label: 'Abort window', unit: 's' },
  { key: 'swingerLimit', label: 'Swinger limit', unit: 'trips' },
  { key: 'cancelWindowMin', label: 'Cancel window', unit: 'min' },
  { key: 'exitRestart', label: 'Exit-time restart' },
  { key: 'autoStay', label: 'Auto-stay when nobody leaves' },
  { key: 'crossZoning', label: 'Cross zoning' },
  { key: 'crossZoneWindowSec', label: 'Cross-zone window', unit: 's' },
  { key: 'duress', label: 'Duress code' },
];

interface Column {
  title: string;
  width: number;
  font: 'sans' | 'mono';
  cell: (zone: SheetZone) => string;
}

/** R = reports to the monitoring center, C = chime, S = supervised; a dash where off. */
export function switchesOf(zone: Pick<ZoneValues, 'reportsToMonitoring' | 'chime' | 'supervised'>): string {
  return [zone.reportsToMonitoring ? 'R' : '–', zone.chime ? 'C' : '–', zone.supervised ? 'S' : '–'].join(' ');
}


const COLUMNS: Column[] = [
  { title: 'Zone', width: 36, font: 'sans', cell: (z) => String(z.number) },
  { title: 'Input', width: 34, font: 'sans', cell: (z) => String(z.input) },
  { title: 'Serial', width: 74, font: 'mono', cell: (z) => z.serial || NONE },
  { title: 'Description', width: 150, font: 'sans', cell: (z) => z.description },
  { title: 'Device type', width: 96, font: 'sans', cell: (z) => DEVICE_TYPE_LABELS[z.deviceType] },
  { title: 'Zone type', width: 134, font: 'sans', cell: (z) => ZONE_TYPE_LABELS[z.zoneType] },
  { title: 'Switches', width: 52, font: 'sans', cell: switchesOf },
  { title: 'Location', width: 80, font: 'sans', cell: (z) => z.location ?? NONE },
  { title: 'Status', width: 64, font: 'sans', cell: (z) => ZONE_STATUS_LABELS[z.status] },
];
const CELL_PAD = 4;

/** "2026-12-03 14:05 (America/Chicago)" */
export function formatInZone(date: Date, timeZone: string): string {
  const render = (tz: string) => {
    const parts = new Intl.DateTimeFormat('en-US', {
      timeZone: tz,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    }).formatToParts(date);
    const part = (type: string) => parts.find((p) => p.type === type)?.value ?? '';
    return `${part('year')}-${part('month')}-${part('day')} ${part('hour')}:${part('minute')} (${tz})`;
  };
  try {
    return render(timeZone);
  } catch {
    return render('UTC');
  }
}

function settingValue(settings: PanelSettings, row: (typeof SETTING_ROWS)[number]): string {
  const value = settings[row.key];
  if (typeof value === 'boolean') return value ? 'On' : 'Off';
  return row.unit ? `${value} ${row.unit}` : String(value);
}

/**
 * The font to set a text in. fontkit cannot lay out the space glyph of the IBM Plex Mono
 * latin .woff ("Offset is outside the bounds of the DataView"), so mono is kept for text
 * without spaces — serials, which allow none — and anything else falls back to the sans.
 */
export function fontFor(text: string, font: 'sans' | 'sansBold' | 'mono'): 'sans' | 'sansBold' | 'mono' {
  return font === 'mono' && /\s/.test(text) ? 'sans' : font;
}



/** Builds the PDF. */
export function buildProgrammingSheet(data: ProgrammingSheetData): Promise<ProgrammingSheet> {
  const doc = new PDFDocument({
    ...PAGE,
    bufferPages: true,
    info: { Title: `Programming sheet — ${data.panel.label} — ${data.site.name}`, Author: data.firmName, Creator: 'Mullion' },
  });
  doc.registerFont('sans', FONTS.sans);
  doc.registerFont('sansBold', FONTS.sansBold);
  doc.registerFont('mono', FONTS.mono);

  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const lines: string[] = [];
  const left = PAGE.margin;
  const right = doc.page.width - PAGE.margin;
  const width = right - left;
  const bottom = doc.page.height - PAGE.margin - 18; // room for the footer

  /** Writes text at (x, y) in a font and size; records it; returns its height. */
  const write = (text: string, x: number, y: number, options: { font?: 'sans' | 'sansBold' | 'mono'; size?: number; color?: string; width?: number } = {}) => {
    doc.font(fontFor(text, options.font ?? 'sans')).fontSize(options.size ?? 9).fillColor(options.color ?? INK);
    const opts = { width: options.width ?? right - x, lineGap: 1 };
    doc.text(text, x, y, opts);
    lines.push(text);
    return doc.heightOfString(text, opts);
  };

  // --- Title block -------------------------------------------------------------------------
  let y = PAGE.margin;
  y += write(data.firmName, left, y, { font: 'sansBold', size: 15 }) + 2;
  y += write('Panel programming sheet', left, y, { size: 11, color: MUTED }) + 10;

  const colWidth = width / 3;
  const blockTop = y;
  let yA = blockTop;
  yA += write('Site', left, yA, { font: 'sansBold', size: 8, color: MUTED, width: colWidth - 12 });
  yA += write(data.site.name, left, yA, { font: 'sansBold', size: 10, width: colWidth - 12 });
  for (const line of data.site.addressLines) yA += write(line, left, yA, { size: 9, width: colWidth - 12 });

  let yB = blockTop;
  const xB = left + colWidth;
  const panelFacts: [string, string][] = [
    ['Panel', data.panel.label],
    ['Make and model', data.panel.makeModel || NONE],
    ['Communication', COMM_PATH_LABELS[data.panel.commPath]],
    ['Installed', data.panel.installedOn ?? NONE],
    ['Zones', `${data.panel.zoneCapacity} (wireless ${data.panel.wirelessZoneFrom}–${data.panel.wirelessZoneTo})`],
  ];
  for (const [label, value] of panelFacts) yB += factLine(label, value, xB, yB, colWidth - 12);

  let yC = blockTop;
  const xC = left + 2 * colWidth;
  const programmed = data.panel.programmedAt ? formatInZone(data.panel.programmedAt, data.site.timeZone) : 'Not yet recorded';
  const facts: [string, string][] = [
    ['Generated', formatInZone(data.generatedAt, data.site.timeZone)],
    ['Last programmed', programmed],
    ['Changed since programmed', data.panel.changedSinceProgrammed ? 'Yes — program the panel' : 'No'],
  ];
  for (const [label, value] of facts) yC += factLine(label, value, xC, yC, colWidth - 12);

  function factLine(label: string, value: string, x: number, top: number, w: number): number {
    const labelHeight = write(label, x, top, { font: 'sansBold', size: 8, color: MUTED, width: w });
    return labelHeight + write(value, x, top + labelHeight, { size: 9, width: w }) + 3;
  }

  y = Math.max(yA, yB, yC) + 10;
  rule(y);
  y += 8;

  // --- Settings and CP-01 findings -----------------------------------------------------------
  y += write('Panel settings (false-alarm reduction, ANSI/SIA CP-01)', left, y, { font: 'sansBold', size: 10 }) + 4;
  const perColumn = Math.ceil(SETTING_ROWS.length / 3);
  let settingsBottom = y;
  SETTING_ROWS.forEach((row, i) => {
    const x = left + Math.floor(i / perColumn) * colWidth;
    const rowY = y + (i % perColumn) * 13;
    write(row.label, x, rowY, { size: 9, color: MUTED, width: 140 });
    write(settingValue(data.settings, row), x + 142, rowY, { size: 9, width: colWidth - 154 });
    settingsBottom = Math.max(settingsBottom, rowY + 13);
  });
  y = settingsBottom + 6;

  if (data.findings.length === 0) {
    y += write('Panel checks (CP-01, standby battery, path): no findings.', left, y, { size: 9, color: MUTED }) + 4;
  } else {
    y += write(`Panel checks: ${data.findings.length} finding${data.findings.length === 1 ? '' : 's'}`, left, y, { font: 'sansBold', size: 9 }) + 2;
    for (const finding of data.findings) {
      if (y > bottom - 24) {
        doc.addPage();
        y = PAGE.margin;
      }
      const tag = `${severityWord(finding.severity)} · ${finding.clause}`;
      const tagHeight = write(tag, left, y, { font: 'sansBold', size: 8, color: MUTED });
      y += tagHeight + write(finding.message, left, y + tagHeight, { size: 9 }) + 4;
    }
  }
  y += 6;

  // --- Zones -------------------------------------------------------------------------------
  const tableWidth = COLUMNS.reduce((sum, c) => sum + c.width, 0);
  const headerRow = (top: number): number => {
    doc.rect(left, top, tableWidth, 16).fill(BAND);
    let x = left;
    for (const column of COLUMNS) {
      write(column.title, x + CELL_PAD, top + 4, { font: 'sansBold', size: 8, color: MUTED, width: column.width - 2 * CELL_PAD });
      x += column.width;
    }
    return top + 16;
  };

  if (y > bottom - 60) {
    doc.addPage();
    y = PAGE.margin;
  }
  y += write(`Zones (${data.zones.length})`, left, y, { font: 'sansBold', size: 10 }) + 2;
  y += write('Switches: R = reports to the monitoring center, C = chime, S = supervised; – = off.', left, y, { size: 8, color: MUTED }) + 4;
  y = headerRow(y);

  if (data.zones.length === 0) {
    y += 4;
    write('No zones in service on this panel yet.', left + CELL_PAD, y, { size: 9, color: MUTED });
  }
  for (const zone of data.zones) {
    const cells = COLUMNS.map((column) => column.cell(zone));
    const height =
      Math.max(
        ...COLUMNS.map((column, i) => {
          doc.font(fontFor(cells[i] ?? '', column.font)).fontSize(8.5);
          return doc.heightOfString(cells[i] ?? '', { width: column.width - 2 * CELL_PAD, lineGap: 1 });
        }),
      ) + 6;
    if (y + height > bottom) {
      doc.addPage();
      y = headerRow(PAGE.margin);
    }
    let x = left;
    COLUMNS.forEach((column, i) => {
      write(cells[i] ?? '', x + CELL_PAD, y + 3, { font: column.font, size: 8.5, width: column.width - 2 * CELL_PAD });
      x += column.width;
    });
    y += height;
    doc.moveTo(left, y).lineTo(left + tableWidth, y).lineWidth(0.5).strokeColor(RULE).stroke();
  }

  // --- Footer on every page ------------------------------------------------------------------
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const footer = `${data.firmName} · ${data.site.name} · ${data.panel.label} · page ${i - range.start + 1} of ${range.count}`;
    // writing below the bottom margin would start a new page: lift the margin while the footer is written
    const margin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    write(footer, left, doc.page.height - PAGE.margin - 10, { size: 7.5, color: MUTED, width });
    doc.page.margins.bottom = margin;
  }

  function rule(at: number) {
    doc.moveTo(left, at).lineTo(right, at).lineWidth(0.75).strokeColor(RULE).stroke();
  }

  doc.end();
  return done.then((pdf) => ({ pdf, lines, pages: range.count }));
}
