/**
 * Server tests fail on an unexpected console.error or console.warn: the server logs only
 * when something went wrong (a 500, a broken example file, a missing engine), and a test
 * that triggers one on purpose must say so by spying on the console itself.
 */
const methods = ['error', 'warn'] as const;
let calls: string[] = [];

beforeEach(() => {
  calls = [];
  for (const method of methods) {
    jest.spyOn(console, method).mockImplementation((...args: unknown[]) => {
      calls.push(`console.${method}: ${args.map(String).join(' ')}`);
    });
  }
});

afterEach(() => {
  for (const method of methods) (console[method] as jest.Mock).mockRestore?.();
  if (calls.length) throw new Error(`unexpected console output:\n${calls.join('\n')}`);
});
