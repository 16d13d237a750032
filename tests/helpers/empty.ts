// Stands in for the server-only marker in tests, which run outside the framework's server build.
export {};
