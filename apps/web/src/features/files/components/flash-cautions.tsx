/** Shown beside every revision download: flashing a control unit goes wrong when these are skipped. */
export const FLASH_CAUTIONS = [
  'Connect a battery supporter before you flash; a sagging battery can leave the unit half-written.',
  'Ignition on, engine off, and do not interrupt the write: no unplugging, no sleeping laptop, no door or light switching.',
  'Drive and log only on a closed course or a dyno, obey the law and keep your eyes on the road.',
  'Follow local rules on emissions and vehicle modifications and defer to licensed professionals for work on the vehicle.',
] as const;

export function FlashCautions() {
  return (
    <aside aria-label="Before you flash" className="rounded-lg border border-warn/30 bg-warn-soft px-4 py-3 text-sm text-warn">
      <p className="font-medium">Before you flash a revision</p>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        {FLASH_CAUTIONS.map((caution) => (
          <li key={caution}>{caution}</li>
        ))}
      </ul>
    </aside>
  );
}
