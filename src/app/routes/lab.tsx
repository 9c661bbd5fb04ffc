// Placeholder until the lab screen is built.
export default function Placeholder() {
  return <p className="text-ink-soft">This screen is being built.</p>;
}
