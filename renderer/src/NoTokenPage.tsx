/**
 * Browser mode opened without its launch token (a bookmark, a typed address, the token
 * dropped when copying): every call to the diary would be refused, so instead of screens full
 * of errors the window says once what happened and how to get in.
 */
import { useDocumentTitle } from './hooks';

export function NoTokenPage() {
  useDocumentTitle('Open Forelog from its address');
  return (
    <main id="main" className="app-main no-token" tabIndex={-1}>
      <section className="empty-state" aria-labelledby="no-token-title" data-testid="no-token">
        <h1 id="no-token-title" className="empty-state__title">
          Open Forelog from the address it printed
        </h1>
        <div className="empty-state__body">
          <p>
            This page was opened without its access token, so the diary will not answer it. When <code>forelog serve</code> starts,
            the first line it prints is the full address, with a new token for that run, for example:
          </p>
          <p>
            <code className="no-token__address">http://127.0.0.1:4567/?token=…</code>
          </p>
          <p>Copy that whole line into the address bar. If the server has stopped, start it again and use the new address.</p>
          <p>
            Started it with <code>npm run forelog -- serve</code>? npm prints a banner of its own first; the address is the line that
            starts with <code>http://127.0.0.1</code>. Run <code>npm run --silent forelog -- serve</code> to see only Forelog’s lines.
          </p>
        </div>
      </section>
    </main>
  );
}
