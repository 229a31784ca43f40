/**
 * The completion report of a job (PDF, pdfkit, portrait Letter): firm, site and address, the
 * job's kind and summary, technician, start and completion in the site's time zone, the notes
 * for the client (never the internal notes), parts with totals, the checklist, the walk-test
 * table and thumbnails of the photos shared with the client. Fonts are the app's IBM Plex
 * Sans, embedded as .woff (pdfkit cannot read .woff2).
 *
 * `buildCompletionReport` is pure (data in, PDF out) and also returns every line of text it
 * wrote, so tests can check the content without decompressing the PDF. `produceCompletionReport`
 * gathers the data of a job, stores the PDF under the firm's folder and records it as a
 * document of the job shared with the client.
 */
import { createRequire } from 'node:module';
import PDFDocument from 'pdfkit';
import { Op } from 'sequelize';
import { JOB_KIND_LABELS, WALK_TEST_RESULT_LABELS, type JobKind, type WalkTestResult } from '@domain/jobs';
import { formatCents } from '@domain/plans';
import { type Ctx, scoped } from '../context';
import { Client } from '../models/Client';
import { Document } from '../models/Document';
import type { ChecklistItem, Job, JobPart } from '../models/Job';
import { Site } from '../models/Site';
import { User } from '../models/User';
import { WalkTest } from '../models/WalkTest';
import { Zone } from '../models/Zone';
import type { TenantFiles } from '../storage/tenant-files';
import { recordAudit } from './audit-recorder';
import { safeFileName } from './documents';
import { formatInZone } from './programming-sheet';
import { todayIn } from './zones';

const require = createRequire(import.meta.url);
const FONTS = {
  sans: require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-400-normal.woff'),
  sansBold: require.resolve('@fontsource/ibm-plex-sans/files/ibm-plex-sans-latin-600-normal.woff'),
} as const;

const MARGIN = 48;
const INK = '#1f1c17';
const MUTED = '#5f584d';
const RULE = '#c9c1b4';
const BAND = '#f1ede6';
const NONE = '—';

export interface ReportWalkTestRow {
  zoneNumber: number | null;
  description: string;
  result: WalkTestResult;
  monitoringConfirmed: boolean;
  note: string;
}

export interface CompletionReportData {
  firmName: string;
  licenceNumber: string;
  site: { name: string; addressLines: string[]; timeZone: string };
  job: {
    kind: JobKind;
    summary: string;
    technicianName: string | null;
    completedByName: string | null;
    startedAt: Date | null;
    completedAt: Date;
    clientNotes: string;
  };
  parts: readonly JobPart[];
  checklist: readonly ChecklistItem[];
  walkTests: readonly ReportWalkTestRow[];
  batteryChanges: readonly { zoneNumber: number; description: string; changedOn: string }[];
  /** thumbnails (JPEG or PNG) of the photos shared with the client */
  photos: readonly { title: string; image: Buffer }[];
  generatedAt: Date;
}

export interface CompletionReport {
  pdf: Buffer;
  lines: string[];
  pages: number;
}

/** The parts' total in cents (quantity × unit price, summed). */
export function partsTotalCents(parts: readonly JobPart[]): number {
  return parts.reduce((sum, p) => sum + p.quantity * p.unitPriceCents, 0);
}

/** Builds the PDF. */
export function buildCompletionReport(data: CompletionReportData): Promise<CompletionReport> {
  const kindLabel = JOB_KIND_LABELS[data.job.kind];
  const doc = new PDFDocument({
    size: 'LETTER',
    margin: MARGIN,
    bufferPages: true,
    info: { Title: `Completion report — ${kindLabel} — ${data.site.name}`, Author: data.firmName, Creator: 'Mullion' },
  });
  doc.registerFont('sans', FONTS.sans);
  doc.registerFont('sansBold', FONTS.sansBold);

  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on('data', (chunk: Buffer) => chunks.push(chunk));
    doc.on('end', () => resolve(Buffer.concat(chunks)));
    doc.on('error', reject);
  });

  const lines: string[] = [];
  const left = MARGIN;
  const right = doc.page.width - MARGIN;
  const width = right - left;
  const bottom = doc.page.height - MARGIN - 18; // room for the footer

  type Font = 'sans' | 'sansBold';
  const measure = (text: string, options: { font?: Font; size?: number; width?: number } = {}) => {
    doc.font(options.font ?? 'sans').fontSize(options.size ?? 9.5);
    return doc.heightOfString(text, { width: options.width ?? width, lineGap: 1 });
  };
  const write = (text: string, x: number, y: number, options: { font?: Font; size?: number; color?: string; width?: number } = {}) => {
    doc.font(options.font ?? 'sans').fontSize(options.size ?? 9.5).fillColor(options.color ?? INK);
    const opts = { width: options.width ?? right - x, lineGap: 1 };
    doc.text(text, x, y, opts);
    lines.push(text);
    return doc.heightOfString(text, opts);
  };
  const rule = (at: number) => {
    doc.moveTo(left, at).lineTo(right, at).lineWidth(0.75).strokeColor(RULE).stroke();
  };

  let y = MARGIN;
  /** Starts a new page when fewer than `needed` points are left. */
  const ensure = (needed: number) => {
    if (y + needed > bottom) {
      doc.addPage();
      y = MARGIN;
    }
  };
  const heading = (text: string) => {
    ensure(40);
    y += 8;
    y += write(text, left, y, { font: 'sansBold', size: 11 }) + 4;
  };

  // --- Title block ------------------------------------------------------------------------
  y += write(data.firmName, left, y, { font: 'sansBold', size: 16 }) + 1;
  if (data.licenceNumber) y += write(`Licence ${data.licenceNumber}`, left, y, { size: 8.5, color: MUTED });
  y += write('Job completion report', left, y, { size: 12, color: MUTED }) + 10;

  const colWidth = width / 2;
  const top = y;
  let yA = top;
  yA += write('Site', left, yA, { font: 'sansBold', size: 8, color: MUTED, width: colWidth - 12 });
  yA += write(data.site.name, left, yA, { font: 'sansBold', size: 10.5, width: colWidth - 12 });
  for (const line of data.site.addressLines) yA += write(line, left, yA, { width: colWidth - 12 });

  let yB = top;
  const xB = left + colWidth;
  const facts: [string, string][] = [
    ['Job', kindLabel],
    ['Technician', data.job.technicianName ?? NONE],
    ['Started', data.job.startedAt ? formatInZone(data.job.startedAt, data.site.timeZone) : NONE],
    ['Completed', formatInZone(data.job.completedAt, data.site.timeZone)],
  ];
  if (data.job.completedByName && data.job.completedByName !== data.job.technicianName) facts.push(['Completed by', data.job.completedByName]);
  for (const [label, value] of facts) {
    const h = write(label, xB, yB, { font: 'sansBold', size: 8, color: MUTED, width: colWidth - 12 });
    yB += h + write(value, xB, yB + h, { width: colWidth - 12 }) + 3;
  }
  y = Math.max(yA, yB) + 8;
  rule(y);
  y += 6;

  // --- Work done ----------------------------------------------------------------------------
  heading('Work done');
  ensure(measure(data.job.summary));
  y += write(data.job.summary, left, y) + 4;
  if (data.job.clientNotes.trim()) {
    ensure(14 + measure(data.job.clientNotes));
    y += write('Notes', left, y, { font: 'sansBold', size: 8, color: MUTED });
    y += write(data.job.clientNotes, left, y) + 2;
  }

  // --- A table helper -----------------------------------------------------------------------
  interface Column {
    title: string;
    width: number;
    align?: 'left' | 'right';
  }
  const table = (columns: Column[], rows: string[][], empty: string) => {
    const tableWidth = columns.reduce((s, c) => s + c.width, 0);
    const header = () => {
      doc.rect(left, y, tableWidth, 16).fill(BAND);
      let x = left;
      for (const c of columns) {
        doc.font('sansBold').fontSize(8).fillColor(MUTED);
        doc.text(c.title, x + 4, y + 4, { width: c.width - 8, align: c.align ?? 'left' });
        lines.push(c.title);
        x += c.width;
      }
      y += 16;
    };
    ensure(40);
    header();
    if (rows.length === 0) {
      y += 4;
      y += write(empty, left + 4, y, { color: MUTED }) + 2;
      return;
    }
    for (const row of rows) {
      const height = Math.max(...columns.map((c, i) => measure(row[i] ?? '', { width: c.width - 8 }))) + 6;
      if (y + height > bottom) {
        doc.addPage();
        y = MARGIN;
        header();
      }
      let x = left;
      columns.forEach((c, i) => {
        doc.font('sans').fontSize(9.5).fillColor(INK);
        doc.text(row[i] ?? '', x + 4, y + 3, { width: c.width - 8, align: c.align ?? 'left', lineGap: 1 });
        lines.push(row[i] ?? '');
        x += c.width;
      });
      y += height;
      doc.moveTo(left, y).lineTo(left + tableWidth, y).lineWidth(0.5).strokeColor(RULE).stroke();
    }
  };

  // --- Parts --------------------------------------------------------------------------------
  heading('Parts');
  table(
    [
      { title: 'Part', width: width - 240 },
      { title: 'Quantity', width: 60, align: 'right' },
      { title: 'Unit price', width: 90, align: 'right' },
      { title: 'Total', width: 90, align: 'right' },
    ],
    data.parts.map((p) => [p.description, String(p.quantity), formatCents(p.unitPriceCents), formatCents(p.quantity * p.unitPriceCents)]),
    'No parts used.',
  );
  if (data.parts.length > 0) {
    ensure(16);
    y += 4;
    const total = `Parts total: ${formatCents(partsTotalCents(data.parts))}`;
    y += write(total, left, y, { font: 'sansBold', width, size: 10 });
  }

  // --- Checklist ----------------------------------------------------------------------------
  heading('Checklist');
  table(
    [
      { title: 'Item', width: width - 80 },
      { title: 'Done', width: 80 },
    ],
    data.checklist.map((c) => [c.label, c.done ? 'Done' : 'Not done']),
    'No checklist on this job.',
  );

  // --- Walk test ----------------------------------------------------------------------------
  heading('Walk test');
  table(
    [
      { title: 'Zone', width: 44 },
      { title: 'Description', width: 140 },
      { title: 'Result', width: 70 },
      { title: 'Center confirmed', width: 90 },
      { title: 'Note', width: width - 344 },
    ],
    data.walkTests.map((w) => [
      w.zoneNumber === null ? NONE : String(w.zoneNumber),
      w.description || NONE,
      WALK_TEST_RESULT_LABELS[w.result],
      w.monitoringConfirmed ? 'Yes' : 'No',
      w.note || '',
    ]),
    'No zones were walk-tested on this visit.',
  );

  if (data.batteryChanges.length > 0) {
    heading('Batteries changed');
    table(
      [
        { title: 'Zone', width: 44 },
        { title: 'Description', width: width - 144 },
        { title: 'Changed on', width: 100 },
      ],
      data.batteryChanges.map((b) => [String(b.zoneNumber), b.description, b.changedOn]),
      '',
    );
  }

  // --- Photos -------------------------------------------------------------------------------
  if (data.photos.length > 0) {
    heading('Photos');
    const gap = 12;
    const cell = (width - 2 * gap) / 3;
    const imageHeight = cell * 0.75;
    data.photos.forEach((photo, i) => {
      const column = i % 3;
      if (column === 0) ensure(imageHeight + 28);
      const x = left + column * (cell + gap);
      try {
        doc.image(photo.image, x, y, { fit: [cell, imageHeight], align: 'center', valign: 'center' });
      } catch {
        doc.rect(x, y, cell, imageHeight).lineWidth(0.5).strokeColor(RULE).stroke();
      }
      write(photo.title, x, y + imageHeight + 3, { size: 8, color: MUTED, width: cell });
      if (column === 2 || i === data.photos.length - 1) y += imageHeight + 26;
    });
  }

  // --- Footer on every page -----------------------------------------------------------------
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const footer = `${data.firmName} · ${data.site.name} · completion report generated ${formatInZone(data.generatedAt, data.site.timeZone)} · page ${i - range.start + 1} of ${range.count}`;
    const margin = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    write(footer, left, doc.page.height - MARGIN - 8, { size: 7.5, color: MUTED, width });
    doc.page.margins.bottom = margin;
  }

  doc.end();
  return done.then((pdf) => ({ pdf, lines, pages: range.count }));
}

/** The address of a site as printed lines. */
export function addressLinesOf(site: Pick<Site, 'addressLine1' | 'addressLine2' | 'city' | 'region' | 'postalCode'>): string[] {
  return [site.addressLine1, site.addressLine2, [site.city, [site.region, site.postalCode].filter(Boolean).join(' ')].filter(Boolean).join(', ')].filter(
    (line) => line && line.trim() !== '',
  );
}

export interface ProducedReport {
  document: Document;
  pdf: Buffer;
  filename: string;
  /** the client record's e-mail address, '' when it has none */
  clientEmail: string;
  siteName: string;
  completedOn: string;
  technicianName: string | null;
  /** every line of text in the PDF (tests read it) */
  lines: string[];
}

/**
 * Builds the report of a job just completed (call inside the completing transaction), stores
 * it through the storage module (the id is pushed to `stored` so the caller can remove it if
 * the transaction fails), records it as a document of the job shared with the client and sets
 * `job.reportFileId`.
 */
export async function produceCompletionReport(
  ctx: Ctx,
  files: TenantFiles,
  job: Job,
  extra: { batteryChanges: { zoneNumber: number; description: string; changedOn: string }[]; now: Date },
  stored: string[],
): Promise<ProducedReport> {
  const transaction = ctx.transaction ?? null;
  const site = await Site.findOne({ where: scoped(ctx, { id: job.siteId }), transaction, rejectOnEmpty: true });
  const client = await Client.findOne({ where: scoped(ctx, { id: site.clientId }), transaction });
  const userIds = [job.technicianId, job.completedById].filter((id): id is string => Boolean(id));
  const users = userIds.length ? await User.findAll({ where: scoped(ctx, { id: { [Op.in]: userIds } }), transaction }) : [];
  const nameOf = (id: string | null | undefined) => (id ? (users.find((u) => u.id === id)?.name ?? null) : null);

  const tests = await WalkTest.findAll({ where: scoped(ctx, { jobId: job.id }), transaction });
  const zones = tests.length ? await Zone.findAll({ where: scoped(ctx, { id: { [Op.in]: tests.map((t) => t.zoneId) } }), transaction }) : [];
  const zoneById = new Map(zones.map((z) => [z.id, z]));
  const touched = new Set(job.touchedZoneIds ?? []);
  const walkTests = tests
    .map((t) => ({ test: t, zone: zoneById.get(t.zoneId) }))
    .sort((a, b) => Number(touched.has(b.test.zoneId)) - Number(touched.has(a.test.zoneId)) || (a.zone?.number ?? 0) - (b.zone?.number ?? 0))
    .map(({ test, zone }) => ({
      zoneNumber: zone?.number ?? null,
      description: zone?.description ?? '',
      result: test.result,
      monitoringConfirmed: Boolean(test.monitoringConfirmed),
      note: test.note ?? '',
    }));

  const photoDocs = await Document.findAll({
    where: scoped(ctx, { jobId: job.id, kind: 'photo', sharedWithClient: true, thumbnailFileId: { [Op.ne]: null } }),
    order: [
      ['createdAt', 'ASC'],
      ['id', 'ASC'],
    ],
    transaction,
  });
  const photos: { title: string; image: Buffer }[] = [];
  for (const photo of photoDocs) {
    try {
      photos.push({ title: photo.title, image: await files.read(job.tenantId, photo.thumbnailFileId!) });
    } catch {
      // a thumbnail missing on disk leaves the photo out of the report, not the report out of the job
    }
  }

  const completedAt = job.completedAt ?? extra.now;
  const report = await buildCompletionReport({
    firmName: ctx.tenant?.name ?? '',
    licenceNumber: ctx.tenant?.licenceNumber ?? '',
    site: { name: site.name, addressLines: addressLinesOf(site), timeZone: site.timeZone },
    job: {
      kind: job.kind,
      summary: job.summary,
      technicianName: nameOf(job.technicianId),
      completedByName: nameOf(job.completedById),
      startedAt: job.startedAt ?? null,
      completedAt,
      clientNotes: job.clientNotes ?? '',
    },
    parts: job.parts ?? [],
    checklist: job.checklist ?? [],
    walkTests,
    batteryChanges: extra.batteryChanges,
    photos,
    generatedAt: extra.now,
  });

  const completedOn = todayIn(site.timeZone, completedAt);
  const title = `Completion report ${completedOn} — ${JOB_KIND_LABELS[job.kind]}`.slice(0, 200);
  const filename = safeFileName(`Completion report ${completedOn} ${site.name}.pdf`, 'pdf');
  const fileId = await files.save(job.tenantId, report.pdf, 'pdf');
  stored.push(fileId);
  const document = await Document.create(
    {
      tenantId: job.tenantId,
      siteId: job.siteId,
      jobId: job.id,
      kind: 'other',
      title,
      fileId,
      contentType: 'application/pdf',
      sizeBytes: report.pdf.length,
      originalName: filename,
      sharedWithClient: true,
      uploadedById: ctx.user?.id ?? null,
    },
    { transaction },
  );
  await job.update({ reportFileId: fileId }, { transaction });
  await recordAudit(ctx, {
    action: 'job.report_created',
    subjectType: 'Job',
    subjectId: job.id,
    details: { documentId: document.id, pages: report.pages, sizeBytes: report.pdf.length },
  });
  return {
    document,
    pdf: report.pdf,
    filename,
    clientEmail: client?.email ?? '',
    siteName: site.name,
    completedOn,
    technicianName: nameOf(job.technicianId),
    lines: report.lines,
  };
}
