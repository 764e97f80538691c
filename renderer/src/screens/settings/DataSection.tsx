/**
 * Your data: the whole diary out as a file (JSON v1, CSV one row per revision, or the open
 * questions' closes as an iCalendar file) and a diary file in (JSON or CSV, all or nothing;
 * a file that overlaps the diary is offered the merge, ImportOverlap.tsx).
 * The same in the desktop app and in browser mode: the files go through the API as text,
 * decoded here from the file's bytes; files above the app's 64 MB cap go to `forelog import`.
 */
import { useState } from 'react';
import { APP_IMPORT_MAX_BYTES, APP_IMPORT_TOO_LARGE, type EXPORT_FORMATS } from '../../../../shared/contract';
import { decodeText, TextDecodingError } from '../../../../shared/text-decoding';
import { api } from '../../api/client';
import { diaryChanged } from '../../api/changes';
import { RequestError, describeError } from '../../api/errors';
import { Button } from '../../components/Button';
import { ErrorBanner } from '../../components/ErrorBanner';
import { FilePicker } from '../../components/FilePicker';
import { useToast } from '../../components/Toast';
import { ImportOverlap, type OverlappingFile } from './ImportOverlap';
import { formatCount, plural } from '../../dates';

type ExportFormat = (typeof EXPORT_FORMATS)[number];

const EXPORTS: { format: ExportFormat; label: string; note: string }[] = [
  { format: 'json', label: 'diary file (JSON)', note: 'everything, in Forelog’s documented format; import it anywhere' },
  { format: 'csv', label: 'spreadsheet (CSV)', note: 'one row per revision' },
  { format: 'ics', label: 'calendar (.ics)', note: 'every open question’s close as an event with a reminder' },
];

/** How long a download's object URL is kept: the browser reads it after the click returns. */
const REVOKE_AFTER_MS = 60_000;

function saveAs(text: string, fileName: string, mediaType: string): void {
  const url = URL.createObjectURL(new Blob([text], { type: `${mediaType};charset=utf-8` }));
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  link.hidden = true;
  document.body.append(link);
  link.click();
  link.remove();
  window.setTimeout(() => URL.revokeObjectURL(url), REVOKE_AFTER_MS);
}

export function DataSection() {
  const toast = useToast();
  const [busy, setBusy] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const [overlap, setOverlap] = useState<OverlappingFile | null>(null);

  async function exportAs(format: ExportFormat) {
    setBusy(format);
    setProblem(null);
    try {
      const file = await api.exportText({ format });
      saveAs(file.text, file.file_name, file.media_type);
      toast.show({ message: `Exported ${file.file_name}.` });
    } catch (error) {
      setProblem(describeError(error));
    } finally {
      setBusy(null);
    }
  }

  async function importFile(file: File) {
    setBusy('import');
    setProblem(null);
    setOverlap(null);
    try {
      const format = /\.csv$/i.test(file.name) ? 'csv' : 'json';
      const tooLarge = `${file.name}: This file ${APP_IMPORT_TOO_LARGE}.`;
      // Larger files go to the command line, which streams them: refused before a byte is read.
      if (file.size > APP_IMPORT_MAX_BYTES) return setProblem(tooLarge);
      // The bytes, decoded by the same decoder as the command line's: UTF-8 with or without
      // a byte order mark, or UTF-16 with one; other bytes are refused where they are.
      const text = decodeText(new Uint8Array(await file.arrayBuffer()));
      // The request carries the text escaped as JSON; its size is what the cap counts.
      if (new Blob([JSON.stringify({ format, text })]).size > APP_IMPORT_MAX_BYTES) return setProblem(tooLarge);
      let added: number;
      try {
        ({ added } = await api.importText({ format, text }));
      } catch (error) {
        // A question id already here: offer the merge rather than a dead end.
        if (error instanceof RequestError && error.code === 'conflict') return setOverlap({ name: file.name, format, text, reason: error.message });
        throw error;
      }
      toast.show({ message: `Imported ${formatCount(added)} question${added === 1 ? '' : 's'} from ${file.name}.` });
      diaryChanged();
    } catch (error) {
      setProblem(`${file.name}: ${error instanceof TextDecodingError ? error.message : describeError(error)}`);
    } finally {
      setBusy(null);
    }
  }

  return (
    <section className="card settings__section" aria-labelledby="settings-data">
      <h2 id="settings-data" className="card__title">
        Your data
      </h2>
      {problem ? <ErrorBanner message={problem} /> : null}
      <ul className="settings__exports">
        {EXPORTS.map((e) => (
          <li key={e.format}>
            <Button onClick={() => void exportAs(e.format)} busy={busy === e.format} disabled={busy !== null}>
              Export {e.label}
            </Button>
            <span className="muted"> {e.note}</span>
          </li>
        ))}
      </ul>
      <p className="settings__import">
        <FilePicker
          label="Import a diary file…"
          accept=".json,.csv,application/json,text/csv"
          onFile={(file) => void importFile(file)}
          disabled={busy !== null}
          note={busy === 'import' ? 'Importing…' : 'JSON (Forelog’s diary file) or CSV'}
        />
      </p>
      {overlap ? (
        <ImportOverlap
          file={overlap}
          onCancel={() => setOverlap(null)}
          onMerged={({ added, skipped }) => {
            setOverlap(null);
            toast.show({
              message: `Merged ${overlap.name}: ${plural(added, 'question')} added, ${plural(skipped, 'question')} already here unchanged and skipped.`,
            });
            diaryChanged();
          }}
        />
      ) : null}
      <p className="muted">
        Imports add questions and never change the ones you have; a file with one bad record is refused whole and says which.
        The desktop app also keeps a copy of the diary every day (the newest seven), and <code>forelog backup FILE</code> makes one
        on demand.
      </p>
    </section>
  );
}
