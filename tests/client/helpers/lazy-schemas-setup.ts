// The API modules load their answer schemas on first use (src/api/client.ts), which in the build
// is a separate file fetched beside the first request. Here the first import would also compile
// the module, which takes longer than the few promise turns a component test waits for: load them
// once per test file, so the tests see the same order of events as a phone with the file cached.
await Promise.all([import('@/api/run.envelopes'), import('@shared/schemas/train.schema'), import('@shared/schemas/common.schema')])
export {}
