/** The short caution wherever run files are handed to the line (README.md, "Safety"). Our own words. */
export function SafetyNote({ className = '' }: { className?: string }) {
  return (
    <aside aria-label="Safety" className={`safety-note rounded border border-sev-warning/60 bg-sev-warning/10 px-4 py-3 text-sm text-ink-800 ${className}`}>
      <p className="font-semibold">Before you run a panel</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        <li>The placement head and conveyor move fast and can start without warning: keep hands out of the work area and use the machine’s covers and stop button.</li>
        <li>Reflow ovens, their exhaust and freshly soldered boards are hot enough to burn.</li>
        <li>Solder paste may contain lead: wear gloves, keep food and drink away from the line and wash your hands afterwards.</li>
        <li>Flux fumes irritate eyes and airways: keep the fume extraction running.</li>
      </ul>
      <p className="mt-1.5 text-xs text-ink-600">
        Placewright prepares data only. Follow the machine maker’s and the paste maker’s instructions, your local codes and your site’s licensed practice.
      </p>
    </aside>
  );
}
