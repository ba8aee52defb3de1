import { describe, expect, it } from 'vitest';
import { compareBase, versionStatus } from '../../shared/review/lifecycle';
import { VERSION_STATES } from '../../shared/schemas/template-api';

// The review steps and what a reader should see are the README's lifecycle (draft → in review →
// released → retired, "request changes" sending a version back to draft); the expected statuses
// below are written out by hand from that table.
describe('what a version shows', () => {
  it('marks a draft whose latest review step is a request for changes, and nothing else', () => {
    expect(versionStatus('draft', 'request-changes')).toBe('changes-requested');
    expect(versionStatus('draft', null)).toBe('draft');
    expect(versionStatus('draft', 'submit')).toBe('draft');
    // Only a draft can carry the mark: once submitted, released or retired the state speaks for itself.
    for (const s of VERSION_STATES.filter((x) => x !== 'draft')) expect(versionStatus(s, 'request-changes')).toBe(s);
  });
});

describe('the version a reviewer reads another against', () => {
  const v = (number: number, state: (typeof VERSION_STATES)[number]) => ({ number, state });
  it('takes the latest released or retired version before it, else the one just before, else none', () => {
    const versions = [v(1, 'retired'), v(2, 'released'), v(3, 'draft'), v(4, 'in-review')];
    expect(compareBase(versions, 4)).toBe(2);
    expect(compareBase(versions, 3)).toBe(2);
    expect(compareBase(versions, 2)).toBe(1);
    expect(compareBase(versions, 1)).toBeNull();
    expect(compareBase([v(1, 'draft'), v(2, 'in-review')], 2)).toBe(1);
    // Order of the list given does not matter.
    expect(compareBase([v(3, 'in-review'), v(2, 'released'), v(1, 'released')], 3)).toBe(2);
  });
});
