/**
 * The printable briefing for the chosen tag, previewed in the page, printed (or saved as PDF
 * through the print dialog) and downloaded as one self-contained HTML file.
 *
 * The preview is an <iframe srcdoc> sandboxed without `allow-scripts`: nothing in it can run,
 * whatever a note says. The app's Content-Security-Policy, which a srcdoc frame inherits,
 * admits the briefing's one <style> by its hash, so the preview shows the printed look.
 * Two sandbox flags are needed for printing: `allow-modals`, without which Chromium ignores
 * print() in a sandboxed frame, and `allow-same-origin`, without which the frame is another
 * origin and this page may not call its print() at all (a SecurityError). Without scripts,
 * the same origin gives the frame nothing it could use.
 */
import { useEffect, useRef, useState } from 'react';
import { api, saveBriefingPdf } from '../../api/client';
import { describeError } from '../../api/errors';
import { useLoad } from '../../api/useLoad';
import { Button } from '../../components/Button';
import { ErrorBanner } from '../../components/ErrorBanner';
import { useToast } from '../../components/Toast';
import { briefingFileName } from './selection';
import { wholePercent } from './wording';

const BRIEFING_SANDBOX = 'allow-same-origin allow-modals';

/** How long the download's object URL is kept: the browser reads it after the click returns. */
const REVOKE_AFTER_MS = 60_000;

export interface BriefingPreviewProps {
  /** '' for the whole diary. */
  tag: string;
  threshold: number;
  /** Changes each time the user asks for the briefing again: the preview comes back into view. */
  focusSignal: number;
  onClose: () => void;
}

export function BriefingPreview({ tag, threshold, focusSignal, onClose }: BriefingPreviewProps) {
  const toast = useToast();
  const briefing = useLoad(() => api.briefing({ ...(tag ? { tag } : {}), threshold }), [tag, threshold]);
  const frameRef = useRef<HTMLIFrameElement>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const [shown, setShown] = useState<string | null>(null);
  const html = briefing.data?.html ?? null;
  const ready = html !== null && shown === html && !briefing.loading;

  // Asking for the briefing moves the reader to it.
  useEffect(() => {
    headingRef.current?.focus({ preventScroll: true });
    headingRef.current?.scrollIntoView({ block: 'start' });
  }, [focusSignal]);

  const print = () => {
    const frame = frameRef.current?.contentWindow;
    try {
      if (!frame) throw new Error('the preview is not on the page');
      frame.focus();
      frame.print();
    } catch (error) {
      toast.show({
        tone: 'error',
        message: `The preview could not be printed (${describeError(error)}). Use Download HTML and print the file from your browser.`,
      });
    }
  };

  const savePdf = async () => {
    if (!saveBriefingPdf) return;
    try {
      const file = await saveBriefingPdf({ ...(tag ? { tag } : {}), threshold });
      if (file) toast.show({ tone: 'success', message: `Saved the briefing as ${file}.` });
    } catch (error) {
      toast.show({ tone: 'error', message: describeError(error) });
    }
  };

  const download = () => {
    if (html === null) return;
    const url = URL.createObjectURL(new Blob([html], { type: 'text/html;charset=utf-8' }));
    const link = document.createElement('a');
    link.href = url;
    link.download = briefingFileName(tag);
    link.hidden = true;
    document.body.append(link);
    link.click();
    link.remove();
    window.setTimeout(() => URL.revokeObjectURL(url), REVOKE_AFTER_MS);
  };

  const subject = tag || 'the whole diary';
  return (
    <section className="hs-briefing card" aria-labelledby="hs-briefing-title" data-testid="briefing" data-briefing-ready={ready ? 'true' : 'false'}>
      <div className="hs-briefing__head">
        <div>
          <h2 id="hs-briefing-title" ref={headingRef} tabIndex={-1} className="hs-briefing__title">
            Briefing for {subject}
          </h2>
          <p className="muted hs-briefing__scope">
            Every question {tag ? `tagged ${tag}` : 'in the diary'}, confident at {wholePercent(threshold)}. The date range above does not
            apply to the briefing.
          </p>
        </div>
        <div className="toolbar">
          {saveBriefingPdf ? (
            <Button variant="primary" onClick={() => void savePdf()} disabled={html === null}>
              Save as PDF…
            </Button>
          ) : null}
          <Button variant={saveBriefingPdf ? 'secondary' : 'primary'} onClick={print} disabled={!ready}>
            {saveBriefingPdf ? 'Print…' : 'Print / Save as PDF'}
          </Button>
          <Button onClick={download} disabled={html === null}>
            Download HTML
          </Button>
          <Button variant="ghost" onClick={onClose}>
            Close preview
          </Button>
        </div>
      </div>
      {briefing.error ? <ErrorBanner message={describeError(briefing.error)} onRetry={briefing.reload} /> : null}
      {html === null ? (
        briefing.error ? null : (
          <p className="muted" role="status">
            Preparing the briefing…
          </p>
        )
      ) : (
        <iframe
          ref={frameRef}
          className="hs-briefing__frame"
          title="Briefing preview"
          sandbox={BRIEFING_SANDBOX}
          srcDoc={html}
          onLoad={() => setShown(html)}
        />
      )}
    </section>
  );
}
