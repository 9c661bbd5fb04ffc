export function ErrorPanel({ title, message }: { title: string; message: string }) {
  return (
    <div role="alert" className="rounded-lg border border-alarm-600/40 bg-white p-6">
      <h2 className="text-lg font-bold text-alarm-600">{title}</h2>
      <p className="mt-2 text-ink-soft">{message}</p>
    </div>
  );
}
