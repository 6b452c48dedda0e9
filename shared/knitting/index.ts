// The engine's public entry, as issue #3 fixed it for outside checks: the same functions and
// types as #shared/engine, whose folder holds the code. App code imports #shared/engine (the
// layer test in tests/unit/sharedLayers.test.ts refuses this path inside the project).
export * from '../engine'
