import '@testing-library/jest-dom/vitest';
import { cleanup, configure } from '@testing-library/react';
import { afterEach } from 'vitest';

// PrimeReact pages render slowly in jsdom on a busy two-core CI machine: give findBy/waitFor room
// (the default is 1 s), so a slow machine does not look like a broken screen.
configure({ asyncUtilTimeout: 5000 });

afterEach(() => {
  cleanup();
  window.localStorage.clear();
});
