import { describe, expect, it } from 'vitest';
import { catchDomainError } from './calibration.fixtures';
import { revisionDownloadName, safeUploadName } from './file-names.rules';

describe('safeUploadName', () => {
  it('keeps the last path part of either slash style', () => {
    expect(safeUploadName('stock read.bin')).toBe('stock read.bin');
    expect(safeUploadName('C:\\Users\\owner\\Desktop\\ecm-read.hex')).toBe('ecm-read.hex');
    expect(safeUploadName('/tmp/uploads/tcm.s19')).toBe('tcm.s19');
    expect(safeUploadName('read..v2.bin')).toBe('read..v2.bin');
  });

  it('refuses "..", control characters and empty names', () => {
    for (const name of ['../../etc/passwd', '..\\secret.bin', '..', 'reads/../x.bin']) {
      expect(catchDomainError(() => safeUploadName(name)).message).toMatch(/must not contain "\.\."/);
    }
    for (const name of ['read\u0000.bin', 'read\n.bin', 'read\u001b[31m.bin', 'read\u007f.bin', 'read\u0085.bin']) {
      expect(catchDomainError(() => safeUploadName(name)).message).toMatch(/control characters/);
    }
    for (const name of ['', '   ', 'folder/', '.']) {
      const error = catchDomainError(() => safeUploadName(name));
      expect(error.code).toBe('validation');
      expect(error.message).toMatch(/empty/);
    }
    expect(catchDomainError(() => safeUploadName(`${'a'.repeat(256)}.bin`)).message).toMatch(/longer than 255/);
  });
});

describe('revisionDownloadName', () => {
  it('slugs every part to lowercase ASCII', () => {
    expect(revisionDownloadName({ customerSurname: 'Müller-Øberg', vehicleShort: "'09 Coupé 2.0T", module: 'ECM', revision: 3, ext: '.HEX' })).toBe(
      'muller-oberg-09-coupe-2-0t-ecm-rev3.hex',
    );
    expect(revisionDownloadName({ customerSurname: 'Straße', vehicleShort: 'Wagon', module: 'TCM', revision: 12, ext: 'bin' })).toBe('strasse-wagon-tcm-rev12.bin');
  });

  it('falls back to a plain word when a part has no Latin letters', () => {
    expect(revisionDownloadName({ customerSurname: '山田', vehicleShort: '—', module: 'ECM', revision: 1, ext: 'bin' })).toBe('customer-vehicle-ecm-rev1.bin');
  });

  it('refuses a revision below 1 and an empty extension', () => {
    const parts = { customerSurname: 'Lee', vehicleShort: 'Hatch', module: 'ECM', revision: 0, ext: 'bin' };
    expect(catchDomainError(() => revisionDownloadName(parts)).code).toBe('validation');
    expect(catchDomainError(() => revisionDownloadName({ ...parts, revision: 1, ext: '..' })).code).toBe('validation');
  });
});
