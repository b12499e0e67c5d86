import { afterEach, beforeEach, vi } from 'vitest';

// A test that logs console.error unexpectedly fails (tests that expect it stub console.error).
let errorSpy: ReturnType<typeof vi.spyOn> | undefined;
beforeEach(() => {
  errorSpy = vi.spyOn(console, 'error');
});
afterEach(() => {
  const calls = errorSpy?.mock.calls ?? [];
  const mocked = errorSpy?.getMockImplementation() !== undefined;
  errorSpy?.mockRestore();
  if (!mocked && calls.length > 0) {
    throw new Error(
      `console.error was called unexpectedly: ${calls.map((c: unknown[]) => c.map(String).join(' ')).join(' | ')}`,
    );
  }
});
