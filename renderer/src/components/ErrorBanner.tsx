import { Button } from './Button';

/** A problem with the whole screen or form (not one field), read out as soon as it appears. */
export function ErrorBanner({ message, details, onRetry }: { message: string; details?: readonly string[]; onRetry?: () => void }) {
  return (
    <div className="error-banner" role="alert" tabIndex={-1}>
      <p className="error-banner__message">{message}</p>
      {details && details.length > 0 ? (
        <ul className="error-banner__details">
          {details.map((d) => (
            <li key={d}>{d}</li>
          ))}
        </ul>
      ) : null}
      {onRetry ? (
        <Button size="sm" onClick={onRetry}>
          Try again
        </Button>
      ) : null}
    </div>
  );
}
