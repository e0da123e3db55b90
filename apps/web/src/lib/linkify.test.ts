import { describe, expect, it } from 'vitest';
import { linkify } from './linkify';

// Expected splits follow RFC 3986 URI syntax: '.', ',' and ')' may end a URL, but at a sentence's end
// they are punctuation, as mail clients treat them [CP].
describe('linkify', () => {
  it('returns plain text untouched', () => {
    expect(linkify('No links here.')).toEqual([{ kind: 'text', text: 'No links here.' }]);
  });

  it('splits a link out of a sentence and leaves the full stop outside', () => {
    expect(linkify('Accept: http://localhost:5173/invitations/abc123. Thanks')).toEqual([
      { kind: 'text', text: 'Accept: ' },
      { kind: 'link', text: 'http://localhost:5173/invitations/abc123', href: 'http://localhost:5173/invitations/abc123' },
      { kind: 'text', text: '. Thanks' },
    ]);
  });

  it('keeps query strings and finds several links', () => {
    const parts = linkify('a https://x.test/reset-password?token=Zk_9-a&b=1\nb (http://y.test/p)');
    expect(parts.filter((part) => part.kind === 'link').map((part) => part.text)).toEqual([
      'https://x.test/reset-password?token=Zk_9-a&b=1',
      'http://y.test/p',
    ]);
    expect(parts.map((part) => part.text).join('')).toBe('a https://x.test/reset-password?token=Zk_9-a&b=1\nb (http://y.test/p)');
  });

  it('does not turn other schemes into links', () => {
    expect(linkify('javascript:alert(1) mailto:a@b.test')).toEqual([{ kind: 'text', text: 'javascript:alert(1) mailto:a@b.test' }]);
  });
});
