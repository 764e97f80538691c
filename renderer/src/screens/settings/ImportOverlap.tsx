/**
 * When a file to import holds questions the diary already has (most often: your own export,
 * imported again), the plain import is refused whole. This panel says so and offers the
 * merge: add the questions that are new, skip those already here unchanged, and if any is
 * here with different contents, import nothing and list them (docs/api.md, "Importing").
 */
import { useEffect, useRef, useState } from 'react';
import type { ImportConflict, ImportResult } from '../../../../shared/contract';
import { api } from '../../api/client';
import { RequestError, describeError } from '../../api/errors';
import { Button } from '../../components/Button';
import { ErrorBanner } from '../../components/ErrorBanner';
import '../../forgiving/forgiving.css';
import { conflictLine } from './importConflicts';

export interface OverlappingFile {
  name: string;
  format: 'json' | 'csv';
  text: string;
  /** The diary's reason for refusing the plain import. */
  reason: string;
}

/** How many conflicts the diary lists at most (docs/api.md, "Importing"). */
const MAX_LISTED = 100;

interface Props {
  file: OverlappingFile;
  onMerged: (result: ImportResult) => void;
  onCancel: () => void;
}


export function ImportOverlap({ file, onMerged, onCancel }: Props) {
  const heading = useRef<HTMLHeadingElement>(null);
  const [busy, setBusy] = useState(false);
  const [refusal, setRefusal] = useState<{ message: string; conflicts: readonly ImportConflict[] } | null>(null);

  useEffect(() => heading.current?.focus(), []);

  async function merge() {
    setBusy(true);
    setRefusal(null);
    try {
      onMerged(await api.importText({ format: file.format, text: file.text, merge: true }));
    } catch (error) {
      setRefusal({ message: describeError(error), conflicts: error instanceof RequestError ? error.conflicts : [] });
      setBusy(false);
    }
  }

  return (
    <section className="import-overlap" aria-labelledby="import-overlap-heading" data-testid="import-overlap">
      <h3 id="import-overlap-heading" ref={heading} tabIndex={-1} className="import-overlap__title">
        {file.name} has questions that are already in this diary
      </h3>
      <p>
        Some of its questions are already here (an export of this diary, or a file imported before), so the plain import was refused and
        nothing changed.
      </p>
      <p className="muted">The diary said: {file.reason}</p>
      <p>
        Merging adds the questions that are new and skips those already here unchanged. If any question here differs from the file’s
        version, nothing is imported and you see which; it is all or nothing, as always.
      </p>
      {refusal ? (
        <>
          <ErrorBanner message={refusal.conflicts.length > 0 ? 'Nothing was imported: these questions differ between the file and the diary.' : refusal.message} />
          {refusal.conflicts.length > 0 ? (
            <>
              <ul className="import-overlap__conflicts" data-testid="import-conflicts">
                {refusal.conflicts.map((c) => (
                  <li key={`${c.index}-${c.id}`}>{conflictLine(c)}</li>
                ))}
              </ul>
              <p>
                For each: to keep the diary’s version, remove the question from the file; to take the file’s, delete it from the diary (or
                give it a new id in the file). Then merge again.
              </p>
              {/* The list stops at 100; the diary's message gives the total. */}
              {refusal.conflicts.length >= MAX_LISTED ? <p className="muted">{refusal.message}</p> : null}
            </>
          ) : null}
        </>
      ) : null}
      <div className="import-overlap__actions">
        <Button variant="primary" onClick={() => void merge()} busy={busy} disabled={refusal !== null && refusal.conflicts.length > 0}>
          Merge (skip questions already here unchanged)
        </Button>
        <Button onClick={onCancel} disabled={busy}>
          {refusal ? 'Close' : 'Cancel'}
        </Button>
      </div>
    </section>
  );
}
