import { ApiError } from '../../lib/api-client.ts';

/** An upload's error, with each row and column problem listed. */
export function UploadProblems({ error }: { error: Error | null }) {
  if (!error) return null;
  const details = error instanceof ApiError ? error.details : undefined;
  return (
    <div role="alert" className="mt-3 rounded-md border border-alarm-600/40 p-3 text-sm">
      <p className="font-semibold text-alarm-600">{details?.length ? 'The file was not taken; nothing was stored.' : error.message}</p>
      {details && details.length > 0 && (
        <ul className="mt-2 list-disc space-y-0.5 pl-5">
          {details.map((d, i) => (
            <li key={i}>
              <span className="font-semibold">{d.path}</span>: {d.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
