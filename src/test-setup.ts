import { setupZonelessTestEnv } from 'jest-preset-angular/setup-env/zoneless';

setupZonelessTestEnv();

// An unexpected console.error in a component test is a failure, not noise to scroll past.
const originalError = console.error;
beforeEach(() => {
  console.error = (...args: unknown[]) => {
    originalError(...args);
    throw new Error(`console.error was called: ${args.map(String).join(' ')}`);
  };
});
afterEach(() => {
  console.error = originalError;
});
