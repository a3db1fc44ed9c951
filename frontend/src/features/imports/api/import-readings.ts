import type { ImportMapping, ImportMode, ImportReport } from '@kilocycle/common/types';
import { toApiError, uploadWithProgress, type UploadProgress } from '@/lib/api-client';

export type ImportReadingsInput = {
  runId: number;
  file: File;
  mode: ImportMode;
  /** Store rows outside the range's span as given instead of refusing them (the person has checked them). */
  confirmed?: boolean;
  mapping: ImportMapping;
  /** Chosen here so the progress can be polled while the upload is still going. */
  importId: string;
  onUploadProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
};

/** The import's outcome: its report, or why it was refused (with the report of bad rows when there is one). */
export type ImportOutcome = { ok: true; report: ImportReport } | { ok: false; status: number; message: string; report: ImportReport | null };

const LIMIT_MESSAGES: Record<number, string> = {
  413: 'The file is larger than the import limit.',
  415: 'The file is not CSV or TSV text.',
};

function isReport(value: unknown): value is ImportReport {
  return typeof value === 'object' && value !== null && 'rejected' in value && Array.isArray((value as { rejected: unknown }).rejected);
}

export function newImportId(): string {
  const random = globalThis.crypto?.randomUUID?.() ?? `${Date.now().toString(36)}${Math.random().toString(36).slice(2)}`;
  return `imp-${random.replace(/[^A-Za-z0-9_-]/g, '')}`.slice(0, 64);
}

/** Uploads the file as multipart field `file`, with the chosen column mapping; bytes sent are reported as they go. */
export async function importReadings({
  runId,
  file,
  mode,
  confirmed = false,
  mapping,
  importId,
  onUploadProgress,
  signal,
}: ImportReadingsInput): Promise<ImportOutcome> {
  const form = new FormData();
  form.append('mapping', JSON.stringify(mapping));
  form.append('file', file, file.name);
  const params = new URLSearchParams({ mode, importId, ...(confirmed ? { confirmed: 'true' } : {}) });
  const result = await uploadWithProgress({ path: `/runs/${runId}/imports?${params.toString()}`, body: form, onUploadProgress, signal });
  if (result.ok && isReport(result.data)) return { ok: true, report: result.data };
  const error = toApiError(result.status, result.data);
  // The server speaks to API clients too; on this page the choice is a radio button, not a parameter.
  const said = error.message.replace(/ with mode=valid\)/, ': choose “Import the valid rows only”)');
  const message = LIMIT_MESSAGES[result.status] ? `${LIMIT_MESSAGES[result.status]} ${said}` : said;
  return { ok: false, status: result.status, message, report: isReport(result.data) ? result.data : null };
}
