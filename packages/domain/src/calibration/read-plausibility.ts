/** How a read's image size compares with the sizes the shop expects for the vehicle's engine family. */
export interface ReadPlausibility {
  status: 'ok' | 'unexpected_size' | 'unknown_family';
  message: string;
  expectedBytes: number[];
}

const kib = (bytes: number) => (bytes % 1024 === 0 ? `${bytes / 1024} KiB` : `${bytes} bytes`);

/**
 * A warning, never a refusal: a read whose image size is none of the expected ones may be a partial read, a read of
 * another control unit, or a file for another engine, so the tuner looks before revising it.
 */
export function readPlausibility(imageBytes: number, expectedBytes: readonly number[] | undefined): ReadPlausibility {
  if (!expectedBytes?.length) {
    return { status: 'unknown_family', message: 'The shop has no expected image sizes for this engine family.', expectedBytes: [] };
  }
  const expected = [...expectedBytes].sort((a, b) => a - b);
  if (expected.includes(imageBytes)) return { status: 'ok', message: `Image size ${kib(imageBytes)} is one this engine family uses.`, expectedBytes: expected };
  return {
    status: 'unexpected_size',
    message: `Image size ${kib(imageBytes)} matches none expected for this engine family (${expected.map(kib).join(', ')}): check it is a full read of the right control unit.`,
    expectedBytes: expected,
  };
}
