// Stands in for the "server-only" marker package under vitest.
export {};
