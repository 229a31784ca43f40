import { useRef, useState } from 'react';
import { AlertTriangle, FileUp } from 'lucide-react';
import { DEVICE_TYPE_LABELS, ZONE_TYPE_LABELS } from '@domain/devices';
import { ZONE_CSV_COLUMNS } from '@domain/schemas/zone';
import { Badge, type BadgeTone } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { Dialog } from '@/components/ui/dialog';
import { FormError } from '@/components/ui/form-field';
import { useToast } from '@/components/ui/toast';
import { ApiError } from '@/lib/api-client';
import type { ApiZoneImportResult, ApiZoneImportRow } from '@/types/api';
import { useImportZones } from '../api/zone-queries';

export interface RowError {
  row: number | null;
  field: string | null;
  message: string;
}

/** `rows.12.serial` → row 12, field serial; any other key is a problem with the whole file. */
export function rowErrorsFrom(fields: Record<string, string>): RowError[] {
  return Object.entries(fields)
    .map(([key, message]) => {
      const m = /^rows\.(\d+)(?:\.(.+))?$/.exec(key);
      if (m) return { row: Number(m[1]), field: m[2] ?? null, message };
      return { row: null, field: key === 'file' ? null : key, message };
    })
    .sort((a, b) => (a.row ?? -1) - (b.row ?? -1) || (a.field ?? '').localeCompare(b.field ?? ''));
}

function rowErrorText(e: RowError): string {
  const where = e.row !== null ? `Row ${e.row}${e.field ? `, ${e.field}` : ''}` : e.field ? `Column ${e.field}` : 'File';
  return `${where}: ${e.message}`;
}

type Stage =
  | { kind: 'choose' }
  | { kind: 'checking'; file: File }
  | { kind: 'invalid'; file: File; message: string; errors: RowError[] }
  | { kind: 'preview'; file: File; result: ApiZoneImportResult }
  | { kind: 'importing'; file: File; result: ApiZoneImportResult };

function zonesWord(n: number): string {
  return n === 1 ? '1 zone' : `${n} zones`;
}

/** Import a panel's zone list from CSV: a dry run first (preview or errors by row), then the real import. */
export function ZoneImportDialog({ open, onClose, panelId, panelLabel }: { open: boolean; onClose: () => void; panelId: string; panelLabel: string }) {
  return (
    <Dialog
      open={open}
      onClose={onClose}
      title="Import zones (CSV)"
      description={`Mullion checks the whole file first and shows what it will do on ${panelLabel}. Nothing is saved unless every row is valid.`}
    >
      <ZoneImport panelId={panelId} onDone={onClose} />
    </Dialog>
  );
}

function ZoneImport({ panelId, onDone }: { panelId: string; onDone: () => void }) {
  const input = useRef<HTMLInputElement>(null);
  const [stage, setStage] = useState<Stage>({ kind: 'choose' });
  const [progress, setProgress] = useState<number>(0);
  const [failure, setFailure] = useState<string | null>(null);
  const upload = useImportZones(panelId);
  const toast = useToast();

  const check = (file: File | undefined) => {
    if (input.current) input.current.value = '';
    if (!file) return;
    setFailure(null);
    setProgress(0);
    setStage({ kind: 'checking', file });
    upload.mutate(
      { file, dryRun: true, onProgress: setProgress },
      {
        onSuccess: (result) => setStage({ kind: 'preview', file, result }),
        onError: (err) => {
          if (err instanceof ApiError && err.status === 400 && Object.keys(err.fields).length > 0) {
            setStage({ kind: 'invalid', file, message: err.message, errors: rowErrorsFrom(err.fields) });
          } else {
            setStage({ kind: 'choose' });
            setFailure(err instanceof ApiError ? err.message : 'The file could not be checked. Try again.');
          }
        },
      },
    );
  };

  const runImport = (file: File, result: ApiZoneImportResult) => {
    setFailure(null);
    setProgress(0);
    setStage({ kind: 'importing', file, result });
    upload.mutate(
      { file, dryRun: false, onProgress: setProgress },
      {
        onSuccess: (saved) => {
          toast.success(`${zonesWord(saved.creates + saved.updates)} imported: ${saved.creates} new, ${saved.updates} updated.`);
          onDone();
        },
        onError: (err) => {
          if (err instanceof ApiError && err.status === 400 && Object.keys(err.fields).length > 0) {
            setStage({ kind: 'invalid', file, message: err.message, errors: rowErrorsFrom(err.fields) });
          } else {
            setStage({ kind: 'preview', file, result });
            setFailure(err instanceof ApiError ? err.message : 'The import failed; nothing was saved. Try again.');
          }
        },
      },
    );
  };

  const busy = stage.kind === 'checking' || stage.kind === 'importing';
  const count = stage.kind === 'preview' || stage.kind === 'importing' ? stage.result.creates + stage.result.updates : 0;

  return (
    <div className="space-y-4">
      <FormError message={failure} />
      <input ref={input} id="zone-csv-file" type="file" accept=".csv,text/csv" className="sr-only" aria-label="CSV file of zones" onChange={(e) => check(e.target.files?.[0])} />

      <div className="flex flex-wrap items-center gap-3">
        <Button variant={stage.kind === 'choose' ? 'primary' : 'secondary'} onClick={() => input.current?.click()} disabled={busy}>
          <FileUp className="size-4" aria-hidden="true" /> {stage.kind === 'choose' ? 'Choose a CSV file' : 'Choose another file'}
        </Button>
        {stage.kind !== 'choose' && <span className="min-w-0 truncate text-sm text-slate-500">{stage.file.name}</span>}
      </div>

      {stage.kind === 'choose' && (
        <p className="text-xs text-slate-500">
          One row per zone under a header row naming the columns: <span className="font-mono break-words">{ZONE_CSV_COLUMNS.join(', ')}</span>. Only description and
          deviceType are required. A row whose number is in use on the panel updates that zone; nothing is deleted. Export CSV gives a file in this form.
        </p>
      )}

      {busy && (
        <div className="space-y-1">
          <p className="text-sm text-slate-500">{stage.kind === 'checking' ? 'Checking the file…' : 'Importing…'}</p>
          <div
            className="h-2 w-full overflow-hidden rounded-md bg-slate-100"
            role="progressbar"
            aria-label={stage.kind === 'checking' ? 'Checking the file' : 'Importing'}
            aria-valuemin={0}
            aria-valuemax={100}
            aria-valuenow={Math.round(progress * 100)}
          >
            <div className="h-full bg-brass-600 transition-[width]" style={{ width: `${Math.round(progress * 100)}%` }} />
          </div>
        </div>
      )}

      {stage.kind === 'invalid' && (
        <div className="space-y-2" role="alert">
          <p className="flex items-start gap-2 text-sm font-medium text-clay-600">
            <AlertTriangle className="mt-0.5 size-4 shrink-0" aria-hidden="true" />
            <span>
              {stage.errors.length === 1 ? '1 problem' : `${stage.errors.length} problems`} in the file. Nothing was saved: correct the file and choose it again.
            </span>
          </p>
          <ul className="max-h-64 space-y-1 overflow-y-auto rounded-md border border-clay-600/30 bg-clay-50 px-3 py-2 text-sm text-ink">
            {stage.errors.map((e) => (
              <li key={`${e.row}-${e.field}-${e.message}`}>{rowErrorText(e)}</li>
            ))}
          </ul>
        </div>
      )}

      {(stage.kind === 'preview' || stage.kind === 'importing') && <Preview result={stage.result} />}

      <div className="flex flex-wrap justify-end gap-2 pt-1">
        <Button variant="secondary" onClick={onDone} disabled={stage.kind === 'importing'}>
          Cancel
        </Button>
        {(stage.kind === 'preview' || stage.kind === 'importing') && (
          <Button busy={stage.kind === 'importing'} disabled={count === 0} onClick={() => runImport(stage.file, stage.result)}>
            Import {zonesWord(count)}
          </Button>
        )}
      </div>
    </div>
  );
}

const ACTION_BADGES: Record<ApiZoneImportRow['action'], { word: string; tone: BadgeTone }> = {
  create: { word: 'New', tone: 'ok' },
  update: { word: 'Update', tone: 'brass' },
  unchanged: { word: 'No change', tone: 'neutral' },
};

function Preview({ result }: { result: ApiZoneImportResult }) {
  const total = result.creates + result.updates;
  const unchanged = result.unchanged ?? 0;
  const rows = result.rows ?? [];
  return (
    <div className="space-y-2">
      <p className="text-sm">
        <span className="font-medium">{total === 0 ? 'The file matches the panel: nothing to import.' : `The file is valid: ${zonesWord(total)} to import`}</span>
        <span className="text-slate-500">
          {' '}
          · {result.creates} new, {result.updates} updated{unchanged > 0 ? `, ${unchanged} unchanged` : ''}
        </span>
      </p>
      {rows.length > 0 && (
        <div className="max-h-64 overflow-auto rounded-md border border-line">
          <table className="w-full border-collapse text-xs">
            <caption className="sr-only">Zones in the file</caption>
            <thead className="sticky top-0 bg-card">
              <tr className="border-b border-line text-left text-slate-500">
                <th scope="col" className="px-2 py-1.5 font-semibold">
                  Zone
                </th>
                <th scope="col" className="px-2 py-1.5 font-semibold">
                  Description
                </th>
                <th scope="col" className="hidden px-2 py-1.5 font-semibold sm:table-cell">
                  Device / zone type
                </th>
                <th scope="col" className="px-2 py-1.5 font-semibold">
                  Serial
                </th>
                <th scope="col" className="px-2 py-1.5 font-semibold">
                  <span className="sr-only">What happens</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((row) => {
                const badge = ACTION_BADGES[row.action];
                return (
                  <tr key={row.row} className="border-b border-line align-top last:border-b-0">
                    <td className="px-2 py-1 tabular-nums">{row.number ?? '—'}</td>
                    <td className="px-2 py-1">{row.description ?? ''}</td>
                    <td className="hidden px-2 py-1 sm:table-cell">
                      {row.deviceType ? (DEVICE_TYPE_LABELS[row.deviceType] ?? row.deviceType) : '—'}
                      {row.zoneType && <span className="block text-slate-500">{ZONE_TYPE_LABELS[row.zoneType] ?? row.zoneType}</span>}
                    </td>
                    <td className="px-2 py-1 font-mono">{row.serial || '—'}</td>
                    <td className="px-2 py-1 text-right">
                      <Badge tone={badge.tone}>{badge.word}</Badge>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
