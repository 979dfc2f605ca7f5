import { convertToParamMap } from '@angular/router';
import { describe, expect, it } from 'vitest';
import {
  type TableState,
  type TableStateOptions,
  readTableState,
  tableStateParams,
} from './url-table-state';

const OPTIONS: TableStateOptions<'q' | 'tier'> = {
  filters: ['q', 'tier'],
  sortFields: ['code', 'name'],
  defaultSort: 'code',
};

describe('readTableState', () => {
  it('falls back to the first page of 25 sorted by the default column', () => {
    expect(readTableState(convertToParamMap({}), OPTIONS)).toEqual({
      filters: {},
      sort: 'code',
      order: 'asc',
      limit: 25,
      offset: 0,
    });
  });

  it('keeps known filters, trims them and drops blank or unknown ones', () => {
    const params = convertToParamMap({ q: '  orv ', tier: ' ', plant: 'P-1' });
    const state = readTableState(params, OPTIONS);
    expect(state.filters).toEqual({ q: 'orv' });
  });

  it('ignores a sort column, page size or offset the table does not offer', () => {
    const params = { sort: 'secret', order: 'sideways', limit: '10000', offset: '-5' };
    expect(readTableState(convertToParamMap(params), OPTIONS)).toMatchObject({
      sort: 'code',
      order: 'asc',
      limit: 25,
      offset: 0,
    });
  });
});

describe('tableStateParams', () => {
  it('writes only what differs from the defaults', () => {
    const state: TableState<'q' | 'tier'> = {
      filters: { q: 'orv' },
      sort: 'code',
      order: 'asc',
      limit: 25,
      offset: 0,
    };
    expect(tableStateParams(state, OPTIONS)).toEqual({ q: 'orv' });
  });

  it('round-trips a full state through the URL', () => {
    const state = {
      filters: { q: 'orv', tier: '2' },
      sort: 'name',
      order: 'desc' as const,
      limit: 100,
      offset: 300,
    };
    const params = tableStateParams(state, OPTIONS);
    const asStrings = Object.fromEntries(
      Object.entries(params).map(([key, value]) => [key, String(value)]),
    );
    expect(readTableState(convertToParamMap(asStrings), OPTIONS)).toEqual(state);
  });
});
