// @vitest-environment happy-dom
// A waiting new version is offered only when nothing is half-typed, and only the user's tap applies it.
import { cleanup, fireEvent, render, screen } from '@testing-library/preact';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { Banners } from '../../web/app/App.tsx';
import { setHalfTyped, updateWaiting } from '../../web/state/app-state.ts';

afterEach(() => {
  cleanup();
  updateWaiting.set(null);
  setHalfTyped('test-pad', false);
});

describe('update prompt', () => {
  it('waits while a pad holds a half-typed value, then offers "Update"; nothing happens without a tap', async () => {
    const accept = vi.fn();
    setHalfTyped('test-pad', true);
    render(<Banners />);
    updateWaiting.set(accept);
    await Promise.resolve();
    expect(screen.queryByRole('button', { name: 'Update' })).toBeNull();
    setHalfTyped('test-pad', false);
    const button = await screen.findByRole('button', { name: 'Update' });
    expect(accept).not.toHaveBeenCalled();
    fireEvent.click(button);
    expect(accept).toHaveBeenCalledTimes(1);
  });
});
