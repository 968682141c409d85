import { beforeEach } from 'vitest';
import { shootOpenPages } from './support/stack';

// When a journey's test fails, every page still open is saved as a screenshot beside the journey's own.
beforeEach(({ onTestFailed }) => {
  onTestFailed(() => shootOpenPages());
});
