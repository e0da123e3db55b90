import type { SpecialRequests, UnitSystem } from '@revloop/contract';
import { Card } from '../../../components/ui/card';
import { formatSpeed } from '../../vehicles/components/vehicle-units';

/** One line per request the customer made, in plain words. */
export function specialRequestLines(requests: SpecialRequests, units: UnitSystem): Array<{ label: string; value: string }> {
  const withNotes = (value: string | null, notes: string | undefined) => [value, notes?.trim()].filter(Boolean).join(' — ') || 'Requested';
  const rpm = (value: number | undefined) => (value === undefined ? null : `${value} rpm`);
  const lines: Array<{ label: string; value: string }> = [];
  if (requests.shiftPoints) lines.push({ label: 'Shift points', value: withNotes(rpm(requests.shiftPoints.rpm), requests.shiftPoints.notes) });
  if (requests.revLimit) lines.push({ label: 'Rev limit', value: withNotes(rpm(requests.revLimit.rpm), requests.revLimit.notes) });
  if (requests.speedLimiter) {
    const kmh = requests.speedLimiter.kmh;
    lines.push({ label: 'Speed limiter', value: withNotes(kmh === undefined ? null : formatSpeed(kmh, units, 0), requests.speedLimiter.notes) });
  }
  if (requests.tyreOrGearChange) {
    const { tyreSize, finalDrive, notes } = requests.tyreOrGearChange;
    const parts = [tyreSize && `tyres ${tyreSize}`, finalDrive !== undefined && `final drive ${finalDrive.toFixed(2)}`].filter(Boolean).join(', ');
    lines.push({ label: 'Tyre or gear change', value: withNotes(parts || null, notes) });
  }
  if (requests.launch) lines.push({ label: 'Launch', value: withNotes(rpm(requests.launch.rpm), requests.launch.notes) });
  if (requests.idle) lines.push({ label: 'Idle speed', value: withNotes(rpm(requests.idle.rpm), requests.idle.notes) });
  return lines;
}

export function GoalsCard({ goals, requests, units }: { goals: string; requests: SpecialRequests; units: UnitSystem }) {
  const lines = specialRequestLines(requests, units);
  return (
    <Card title="Goals and special requests">
      <p className="text-sm whitespace-pre-line text-ink-800">{goals}</p>
      <h3 className="mt-4 text-sm font-semibold text-ink-900">Special requests</h3>
      {lines.length === 0 ? (
        <p className="mt-1 text-sm text-ink-600">None.</p>
      ) : (
        <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
          {lines.map((line) => (
            <div key={line.label} className="contents">
              <dt className="text-ink-600">{line.label}</dt>
              <dd className="text-ink-900">{line.value}</dd>
            </div>
          ))}
        </dl>
      )}
    </Card>
  );
}
