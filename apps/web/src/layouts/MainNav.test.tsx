import { describe, expect, it } from 'vitest';
import { cleanup, screen } from '@testing-library/react';
import { renderPage } from '../test/render';
import { MainNav } from './AppLayout';

const currentAt = (url: string) => {
  cleanup();
  renderPage(() => <MainNav />, { path: '*', url });
  return screen
    .getAllByRole('link')
    .filter((a) => a.getAttribute('aria-current') === 'page')
    .map((a) => a.textContent);
};

describe('main navigation', () => {
  it('marks the section a page belongs to, in words for assistive tech as well as by look', () => {
    expect(currentAt('/')).toEqual(['Cultures']);
    expect(currentAt('/cultures/abc123/lineage')).toEqual(['Cultures']);
    expect(currentAt('/batches/42')).toEqual(['Brew day']);
    expect(currentAt('/clubs/demo/bank')).toEqual(['Clubs']);
    expect(currentAt('/notifications')).toEqual(['Account']);
  });

  it('does not mark a section for a look-alike path', () => {
    expect(currentAt('/culturesque')).toEqual([]);
  });
});
