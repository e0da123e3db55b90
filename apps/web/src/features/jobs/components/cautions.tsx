/** What everyone on a job accepts before it opens, and what the customer portal repeats. */
export const CAUTIONS = [
  'Log only on a closed course or a dyno, never on public roads.',
  'Obey the law and keep your eyes on the road; let a passenger or the logger watch the numbers.',
  'When flashing: connect a battery supporter, switch the ignition on with the engine off, and do not interrupt the write.',
  'Follow local rules on emissions and vehicle modifications, and defer to licensed professionals for work on the vehicle.',
  'Calibration advice is advice to a tuner, not a guarantee of power, economy or reliability.',
] as const;

export function CautionsList({ className }: { className?: string }) {
  return (
    <ul className={className ?? 'list-disc space-y-1 pl-5 text-sm text-ink-800'}>
      {CAUTIONS.map((caution) => (
        <li key={caution}>{caution}</li>
      ))}
    </ul>
  );
}
