import { useState } from 'react';
import type { DiffRange, HexRow } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { Field } from '../../../components/ui/field';
import { Input } from '../../../components/ui/input';
import { Spinner } from '../../../components/ui/spinner';
import { cn } from '../../../lib/cn';
import { errorMessage } from '../../../lib/form-errors';
import { useDiffHex } from '../api/get-diff-hex';
import { useFileDiff } from '../api/get-file-diff';
import { formatBytes, formatShare, hexAddress, hexByte } from './file-format';
import { ScrollRegion } from '../../../components/ui/scroll-region';

const PAGE_SIZE = 25;
/** Bytes of one range shown at a time; the server caps a view at 4 KiB too. */
const HEX_WINDOW = 1024;

function HexSide({ row, side }: { row: HexRow; side: 'left' | 'right' }) {
  const cells = row[side];
  const text = side === 'left' ? row.leftText : row.rightText;
  return (
    <>
      <td className="px-2 py-0.5 whitespace-nowrap">
        {cells.map((cell, i) => (
          <span key={i} className={cn('inline-block w-[2.6ch] text-center', row.changed[i] && (side === 'left' ? 'bg-bad-soft text-bad' : 'bg-ok-soft text-ok'))}>
            {hexByte(cell)}
          </span>
        ))}
      </td>
      <td className="px-2 py-0.5 whitespace-pre text-ink-600">
        {[...text].map((char, i) => (
          <span key={i} className={cn(row.changed[i] && 'bg-warn-soft text-warn')}>
            {char}
          </span>
        ))}
      </td>
    </>
  );
}

/** Side-by-side hex and text of one changed range, a window at a time. */
function HexPane({ a, b, range }: { a: string; b: string; range: DiffRange }) {
  const [offset, setOffset] = useState(0);
  const start = range.start + offset;
  const end = Math.min(range.end, start + HEX_WINDOW);
  const hex = useDiffHex(a, b, { start, end });
  const span = range.end - range.start;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-700">
        <span>
          {hexAddress(start)}–{hexAddress(end - 1)} of a {formatBytes(span)} range, {range.changedBytes} byte{range.changedBytes === 1 ? '' : 's'} changed
        </span>
        {span > HEX_WINDOW && (
          <span className="flex gap-2">
            <Button size="sm" variant="secondary" disabled={offset === 0} onClick={() => setOffset(Math.max(0, offset - HEX_WINDOW))}>
              Earlier bytes
            </Button>
            <Button size="sm" variant="secondary" disabled={start + HEX_WINDOW >= range.end} onClick={() => setOffset(offset + HEX_WINDOW)}>
              Later bytes
            </Button>
          </span>
        )}
      </div>
      {hex.isPending && <Spinner label="Loading bytes" />}
      {hex.isError && <Banner tone="bad">{errorMessage(hex.error)}</Banner>}
      {hex.data && (
        <ScrollRegion label="Bytes side by side" className="rounded-lg border border-ink-200">
          <table className="font-mono text-xs" aria-label="Bytes side by side">
            <thead className="bg-ink-50 text-ink-600">
              <tr>
                <th scope="col" className="px-2 py-1 text-left font-medium">Address</th>
                <th scope="col" className="px-2 py-1 text-left font-medium">First file (hex)</th>
                <th scope="col" className="px-2 py-1 text-left font-medium">Text</th>
                <th scope="col" className="px-2 py-1 text-left font-medium">Second file (hex)</th>
                <th scope="col" className="px-2 py-1 text-left font-medium">Text</th>
              </tr>
            </thead>
            <tbody>
              {hex.data.data.rows.map((row) => (
                <tr key={row.address} className="border-t border-ink-100">
                  <th scope="row" className="px-2 py-0.5 text-left font-normal text-ink-600">{hexAddress(row.address)}</th>
                  <HexSide row={row} side="left" />
                  <HexSide row={row} side="right" />
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollRegion>
      )}
    </div>
  );
}

/** What changed between two images of one module: totals, the changed ranges page by page, and their bytes. */
export function DiffView({ a, b }: { a: string; b: string }) {
  const [gap, setGap] = useState(16);
  const [gapText, setGapText] = useState('16');
  const [page, setPage] = useState(1);
  const [selected, setSelected] = useState<DiffRange | null>(null);
  const diff = useFileDiff(a, b, { gap, page, pageSize: PAGE_SIZE });

  if (diff.isPending) return <Spinner label="Comparing the files" />;
  if (diff.isError) return <Banner tone="bad" title="These files cannot be compared">{errorMessage(diff.error)}</Banner>;
  const d = diff.data.data;
  const current = selected ?? d.ranges[0] ?? null;
  const gapValid = /^\d{1,4}$/.test(gapText) && Number(gapText) <= 4096;

  return (
    <div className="flex flex-col gap-6">
      <Card title={`${d.a.label} → ${d.b.label}`} description={`${d.a.module} · ${d.a.formatLabel} against ${d.b.formatLabel}`}>
        <dl className="grid gap-4 sm:grid-cols-4">
          <div>
            <dt className="text-xs text-ink-600 uppercase">Changed bytes</dt>
            <dd className="text-lg font-semibold text-ink-900">{d.changedBytes.toLocaleString()}</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-600 uppercase">Share</dt>
            <dd className="text-lg font-semibold text-ink-900">{formatShare(d.changedShare)}</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-600 uppercase">Changed ranges</dt>
            <dd className="text-lg font-semibold text-ink-900">{d.totalRanges.toLocaleString()}</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-600 uppercase">Compared</dt>
            <dd className="text-lg font-semibold text-ink-900">{formatBytes(d.comparedBytes)}</dd>
          </div>
        </dl>
        <form
          className="mt-4 flex items-end gap-2"
          onSubmit={(event) => {
            event.preventDefault();
            if (!gapValid) return;
            setGap(Number(gapText));
            setPage(1);
            setSelected(null);
          }}
        >
          <Field id="diff-gap" label="Merge changes closer than (bytes)" error={gapValid ? undefined : 'Use a whole number from 0 to 4096.'}>
            {(a11y) => <Input {...a11y} inputMode="numeric" className="w-32" value={gapText} onChange={(e) => setGapText(e.target.value)} />}
          </Field>
          <Button type="submit" variant="secondary">
            Apply
          </Button>
        </form>
      </Card>
      {d.totalRanges === 0 ? (
        <Banner tone="ok" title="The images are identical">Every byte at every address is the same.</Banner>
      ) : (
        <div className="grid gap-6 lg:grid-cols-[18rem_minmax(0,1fr)]">
          <Card title="Changed ranges" description={`Page ${d.page} of ${d.pageCount}`}>
            <ul className="flex flex-col gap-1" aria-label="Changed ranges">
              {d.ranges.map((range) => (
                <li key={range.start}>
                  <button
                    type="button"
                    aria-pressed={current?.start === range.start}
                    onClick={() => setSelected(range)}
                    className={cn('w-full rounded-md px-2 py-1 text-left font-mono text-xs hover:bg-ink-100', current?.start === range.start && 'bg-accent-50 text-accent-800')}
                  >
                    {hexAddress(range.start)}–{hexAddress(range.end - 1)} · {range.changedBytes} B
                  </button>
                </li>
              ))}
            </ul>
            {d.pageCount > 1 && (
              <div className="mt-3 flex justify-between gap-2">
                <Button size="sm" variant="secondary" disabled={page <= 1} onClick={() => { setPage(page - 1); setSelected(null); }}>
                  Previous
                </Button>
                <Button size="sm" variant="secondary" disabled={page >= d.pageCount} onClick={() => { setPage(page + 1); setSelected(null); }}>
                  Next
                </Button>
              </div>
            )}
          </Card>
          <Card title="Bytes side by side">{current && <HexPane key={`${current.start}-${gap}`} a={a} b={b} range={current} />}</Card>
        </div>
      )}
    </div>
  );
}
