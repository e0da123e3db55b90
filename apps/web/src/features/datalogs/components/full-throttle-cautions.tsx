/** Shown wherever someone is asked to log a full-throttle pull. */
export function FullThrottleCautions() {
  return (
    <div className="rounded-lg border border-warn/30 bg-warn-soft px-4 py-3 text-sm text-warn">
      <p className="font-medium">Before a full-throttle pull</p>
      <ul className="mt-1 list-disc pl-5">
        <li>Do it only on a closed course or a dyno, never on a public road.</li>
        <li>Obey the law and keep your eyes on the road; a passenger or the logger records, not the driver.</li>
        <li>Follow local rules, and leave anything you are unsure of to licensed professionals.</li>
        <li>The analysis is advice to a tuner, not a guarantee about your engine.</li>
      </ul>
    </div>
  );
}
