import { render, screen } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { linkify } from './linkify';

describe('linkify', () => {
  it('makes each address a link and leaves trailing punctuation as text', () => {
    const text =
      'Choose a new password: http://127.0.0.1:3000/reset-password?token=abc_123-XYZ.\nOr see https://example.test/help).';
    const { container } = render(<p>{linkify(text)}</p>);
    const links = screen.getAllByRole('link');
    expect(links.map((link) => link.getAttribute('href'))).toEqual([
      'http://127.0.0.1:3000/reset-password?token=abc_123-XYZ',
      'https://example.test/help',
    ]);
    expect(container.textContent).toBe(text);
  });

  it('returns plain text untouched when there is no address', () => {
    expect(linkify('No links here.')).toEqual(['No links here.']);
  });
});
