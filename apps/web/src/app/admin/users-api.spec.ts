import { describe, expect, it } from 'vitest';
import { userQueryParams } from './users-api';

describe('userQueryParams', () => {
  it('writes every given field, trimming the text', () => {
    const params = userQueryParams({
      q: '  keller ',
      role: 'buyer',
      sort: 'lastLoginAt',
      order: 'desc',
      limit: 50,
      offset: 100,
    });
    expect(params.toString()).toBe(
      'q=keller&role=buyer&sort=lastLoginAt&order=desc&limit=50&offset=100',
    );
  });

  it('leaves out empty text, missing role and missing sort (order only goes with a sort)', () => {
    expect(userQueryParams({ q: '   ', order: 'desc', limit: 25, offset: 0 }).toString()).toBe(
      'limit=25&offset=0',
    );
  });

  it('defaults the order to ascending when only a sort is given', () => {
    expect(userQueryParams({ sort: 'name' }).toString()).toBe('sort=name&order=asc');
  });
});
