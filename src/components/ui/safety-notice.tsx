/** The cautions shown beside anything that could steer harvest, sampling or diving. */
export function SafetyNotice({ compact = false }: { compact?: boolean }) {
  return (
    <aside aria-label="Cautions" className="rounded-lg border border-ember-600/40 bg-ember-100 p-4 text-sm text-ink">
      <p className="font-semibold">Planktide gives model estimates, not official results.</p>
      {!compact && (
        <ul className="mt-2 list-disc space-y-1 pl-5">
          <li>It never replaces official biotoxin testing, area classification or closures.</li>
          <li>Never harvest from a closed area. Cooking and freezing do not destroy shellfish toxins.</li>
          <li>Local regulation and licensed practice (shellfish sanitation, veterinary, diving) always come first.</li>
          <li>A slack window is not a dive plan.</li>
        </ul>
      )}
    </aside>
  );
}
