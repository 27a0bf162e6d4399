// The software version recorded in results, logs and reports (kept in step with package.json by a test).

export const VERSION = '0.1.0';
