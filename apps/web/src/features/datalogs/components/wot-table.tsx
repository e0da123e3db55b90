import type { WotPull } from '@revloop/domain/datalog';
import { formatSigned } from '../../../lib/format';

const signed = (v: number) => `${formatSigned(v)} %`;

/** Each full-throttle pull: gears, rpm span, pedal, and the lambda error per rpm bin with the fuel change that removes it. */
export function WotTable({ pulls }: { pulls: WotPull[] }) {
  if (pulls.length === 0) return <p className="text-sm text-ink-600">No full-throttle pull was found in this log.</p>;
  return (
    <div className="flex flex-col gap-4">
      {pulls.map((pull, i) => (
        <div key={pull.startS}>
          <p className="mb-1 text-sm text-ink-800">
            <strong>Pull {i + 1}</strong> at {pull.startS.toFixed(1)}–{pull.endS.toFixed(1)} s, {pull.gears.length > 0 ? `gear ${pull.gears.join(' → ')}` : pull.gearsHeld ? `${pull.gearsHeld} gear${pull.gearsHeld === 1 ? '' : 's'} held` : 'gear unknown'},{' '}
            {Math.round(pull.rpmStart)}–{Math.round(pull.rpmEnd)} rpm, pedal up to {Math.round(pull.maxPedalPct)} %
          </p>
          <table className="w-full max-w-xl text-sm">
            <thead className="text-left text-ink-600">
              <tr>
                <th scope="col" className="py-1 font-medium">rpm</th>
                <th scope="col" className="py-1 font-medium">Samples</th>
                <th scope="col" className="py-1 font-medium">λ error (+ lean)</th>
                <th scope="col" className="py-1 font-medium">Fuel correction</th>
              </tr>
            </thead>
            <tbody className="tabular-nums">
              {pull.lambdaError.map((bin) => (
                <tr key={bin.rpm[0]} className="border-t border-ink-100">
                  <td className="py-1">{bin.rpm[0]}–{bin.rpm[1]}</td>
                  <td className="py-1">{bin.samples}</td>
                  <td className="py-1">{signed(bin.meanErrorPct)}</td>
                  <td className="py-1">{bin.fuelCorrectionPct === null ? 'held back' : signed(bin.fuelCorrectionPct)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ))}
    </div>
  );
}
