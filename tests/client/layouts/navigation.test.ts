// Navigation per role, against the role table of the HTTP API (CONTRACT section 6): testers do not
// list designs; only reviewers review; tokens are for testers and admins; admin pages for admins.
import { describe, expect, it } from 'vitest';
import { navigationFor } from '../../../src/layouts/navigation';

describe('navigationFor', () => {
  it.each([
    ['engineer', ['designs', 'releases']],
    ['reviewer', ['designs', 'review-queue', 'releases']],
    ['tester', ['releases', 'tokens']],
    ['admin', ['designs', 'releases', 'tokens', 'admin-users', 'admin-audit', 'admin-mail']],
  ] as const)('%s sees %j', (role, names) => {
    expect(navigationFor(role).map((e) => e.name)).toEqual(names);
  });
});
