import { DomainError } from '../errors';
import { hasUnsafeNameCharacter, UNSAFE_NAME_MESSAGE } from '../text/name-text.rules';

const MAX_NAME_LENGTH = 255;

/**
 * The file name to keep for an upload: directory parts (either slash) are stripped; a ".." part,
 * control and text-direction characters, an empty name and names over 255 characters are refused.
 */
export function safeUploadName(name: string): string {
  // A bidi override in a file name spoofs its extension ("stock\u202Enib.exe" shows as "stockexe.bin").
  if (hasUnsafeNameCharacter(name)) throw new DomainError('validation', `The file name is refused. ${UNSAFE_NAME_MESSAGE}`);
  const parts = name.normalize('NFC').split(/[/\\]/);
  if (parts.some((part) => part.trim() === '..')) {
    throw new DomainError('validation', 'The file name must not contain "..".');
  }
  const base = (parts.at(-1) ?? '').trim();
  if (base === '' || base === '.') throw new DomainError('validation', 'The file name is empty.');
  if (base.length > MAX_NAME_LENGTH) throw new DomainError('validation', `The file name is longer than ${MAX_NAME_LENGTH} characters.`);
  return base;
}

// Letters that Unicode decomposition does not reduce to ASCII.
const TRANSLITERATIONS: Record<string, string> = { æ: 'ae', ø: 'o', œ: 'oe', ß: 'ss', ł: 'l', đ: 'd', ð: 'd', þ: 'th', ı: 'i' };

/** Lowercase ASCII `[a-z0-9-]`: accents dropped, every other run of characters becomes one hyphen. */
export function slug(text: string): string {
  return text
    .toLowerCase()
    .normalize('NFKD')
    .replace(/\p{M}/gu, '')
    .replace(/[æøœßłđðþı]/g, (char) => TRANSLITERATIONS[char] ?? '')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '');
}

export interface RevisionNameParts {
  customerSurname: string;
  vehicleShort: string;
  module: string;
  revision: number;
  ext: string;
}

/**
 * `<customer-surname>-<vehicle-short>-<module>-rev<N>.<ext>`, every part slugged; a part that slugs
 * to nothing (a name in a non-Latin script) becomes "customer", "vehicle" or "module".
 */
export function revisionDownloadName({ customerSurname, vehicleShort, module, revision, ext }: RevisionNameParts): string {
  if (!Number.isInteger(revision) || revision < 1) throw new DomainError('validation', `A revision number is a whole number from 1; got ${revision}.`);
  const extension = slug(ext).replace(/-/g, '');
  if (extension === '') throw new DomainError('validation', `"${ext}" is not a file extension.`);
  const parts = [slug(customerSurname) || 'customer', slug(vehicleShort) || 'vehicle', slug(module) || 'module'];
  return `${parts.join('-')}-rev${revision}.${extension}`;
}
