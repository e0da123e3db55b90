import { describe, expect, it } from 'vitest';
import { asSubject, defineAbilityFor, type FileSubject } from './ability';
import type { Actor, ShopRole } from './roles';

const S = 'shop-own';
const ME = 'user-me';
const D = 'dealer-own';

const actorOf = (role: ShopRole, over: Partial<Actor> = {}): Actor => ({
  userId: ME,
  platformAdmin: false,
  shopId: S,
  role,
  dealerId: role === 'dealer' ? D : null,
  shopReadOnly: false,
  ...over,
});

/** A file of a job that every role below may read (own shop, own dealer, own customer, assigned to me). */
const file = (over: Partial<FileSubject> = {}) =>
  asSubject('File', { shopId: S, assignedTunerId: ME, dealerId: D, customerUserId: ME, awaitingApproval: false, kind: 'read', sent: true, uploadedByUserId: 'someone-else', approvalPending: false, ...over } satisfies FileSubject);

type Audience = 'sent' | 'unsent';
type Uploader = 'me' | 'other';
const KINDS = ['read', 'revision', 're_read'] as const;

/**
 * Expected visibility, written out by hand from the product rule (DESIGN.md "Files"): the shop side sees every file;
 * a revision reaches the customer side only once its round has started; the dealer then sees every file of its
 * customers' jobs; the customer sees sent revisions and their own uploads. Reads and re-reads are always "sent".
 */
function expected(role: ShopRole, kind: (typeof KINDS)[number], audience: Audience, uploader: Uploader): boolean {
  if (role === 'owner' || role === 'tuner') return true;
  if (audience === 'unsent') return false;
  if (role === 'dealer') return true;
  return kind === 'revision' || uploader === 'me';
}

describe('File rules: every role × file kind × audience × uploader', () => {
  for (const role of ['owner', 'tuner', 'dealer', 'customer'] as const) {
    for (const kind of KINDS) {
      for (const audience of ['sent', 'unsent'] as const) {
        // Only a revision can be unsent: its round has not started.
        if (audience === 'unsent' && kind !== 'revision') continue;
        for (const uploader of ['me', 'other'] as const) {
          const want = expected(role, kind, audience, uploader);
          it(`${role} ${want ? 'sees' : 'does not see'} a ${audience} ${kind} uploaded by ${uploader}`, () => {
            const subject = file({ kind, sent: audience === 'sent', uploadedByUserId: uploader === 'me' ? ME : 'someone-else' });
            const ability = defineAbilityFor(actorOf(role));
            expect(ability.can('read', subject)).toBe(want);
            // Only the shop side checks files against the revisions.
            expect(ability.can('verify', subject)).toBe(role === 'owner' || role === 'tuner');
          });
        }
      }
    }
  }
});

describe('File rules follow the job scope', () => {
  it('a tuner sees files of jobs assigned to them or to nobody, not of another tuner’s job', () => {
    const a = defineAbilityFor(actorOf('tuner'));
    expect(a.can('read', file({ assignedTunerId: null, kind: 'revision', sent: false }))).toBe(true);
    expect(a.can('read', file({ assignedTunerId: 'other-tuner' }))).toBe(false);
    expect(a.can('verify', file({ assignedTunerId: 'other-tuner' }))).toBe(false);
  });

  it('a dealer sees only its own customers’ files; a customer only files of their own jobs', () => {
    expect(defineAbilityFor(actorOf('dealer')).can('read', file({ dealerId: 'other-dealer' }))).toBe(false);
    expect(defineAbilityFor(actorOf('dealer', { dealerId: null })).can('read', file())).toBe(false);
    expect(defineAbilityFor(actorOf('customer')).can('read', file({ customerUserId: 'another', kind: 'revision' }))).toBe(false);
    expect(defineAbilityFor(actorOf('customer')).can('read', file({ customerUserId: 'another', uploadedByUserId: ME }))).toBe(false);
  });

  it('nobody sees another shop’s files, and a platform admin sees none', () => {
    for (const role of ['owner', 'tuner', 'dealer', 'customer'] as const) {
      expect(defineAbilityFor(actorOf(role)).can('read', file({ shopId: 'shop-other' }))).toBe(false);
    }
    const admin: Actor = { userId: ME, platformAdmin: true, shopId: null, role: null, dealerId: null, shopReadOnly: false };
    expect(defineAbilityFor(admin).can('read', file())).toBe(false);
  });

  it('a read-only shop keeps seeing and checking its files', () => {
    const a = defineAbilityFor(actorOf('owner', { shopReadOnly: true }));
    expect(a.can('read', file({ kind: 'revision', sent: false }))).toBe(true);
    expect(a.can('verify', file())).toBe(true);
    expect(defineAbilityFor(actorOf('customer', { shopReadOnly: true })).can('read', file({ kind: 'revision' }))).toBe(true);
  });
});

describe('Revision drafts: approval by a second person', () => {
  const draft = (over: Partial<FileSubject> = {}) => file({ kind: 'revision', sent: false, approvalPending: true, awaitingApproval: true, ...over });

  it('another tuner or the owner approves a draft waiting for approval; its uploader never does', () => {
    expect(defineAbilityFor(actorOf('owner')).can('approve', draft())).toBe(true);
    expect(defineAbilityFor(actorOf('tuner')).can('approve', draft())).toBe(true);
    expect(defineAbilityFor(actorOf('tuner')).can('approve', draft({ uploadedByUserId: ME }))).toBe(false);
    expect(defineAbilityFor(actorOf('owner')).can('approve', draft({ uploadedByUserId: ME }))).toBe(false);
  });

  it('a tuner outside the job reviews its files while a draft waits for approval, not otherwise', () => {
    const tuner = defineAbilityFor(actorOf('tuner'));
    expect(tuner.can('read', draft({ assignedTunerId: 'other-tuner' }))).toBe(true);
    expect(tuner.can('approve', draft({ assignedTunerId: 'other-tuner' }))).toBe(true);
    expect(tuner.can('read', file({ assignedTunerId: 'other-tuner', awaitingApproval: true }))).toBe(true);
    expect(tuner.can('read', file({ assignedTunerId: 'other-tuner' }))).toBe(false);
  });

  it('nothing to approve once approved, sent, or not asked for; never by the customer side or a read-only shop', () => {
    const owner = defineAbilityFor(actorOf('owner'));
    expect(owner.can('approve', draft({ approvalPending: false }))).toBe(false);
    expect(owner.can('approve', draft({ sent: true }))).toBe(false);
    expect(owner.can('approve', draft({ kind: 'read' }))).toBe(false);
    for (const role of ['dealer', 'customer'] as const) {
      expect(defineAbilityFor(actorOf(role)).can('approve', draft())).toBe(false);
      expect(defineAbilityFor(actorOf(role)).can('read', draft())).toBe(false);
    }
    expect(defineAbilityFor(actorOf('owner', { shopReadOnly: true })).can('approve', draft())).toBe(false);
  });

  it('who approved which draft is read by the staff only', () => {
    const approval = asSubject('Approval', { shopId: S });
    expect(defineAbilityFor(actorOf('owner')).can('read', approval)).toBe(true);
    expect(defineAbilityFor(actorOf('tuner')).can('read', approval)).toBe(true);
    expect(defineAbilityFor(actorOf('dealer')).can('read', approval)).toBe(false);
    expect(defineAbilityFor(actorOf('customer')).can('read', approval)).toBe(false);
  });
});
