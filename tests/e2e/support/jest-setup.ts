// Browser journeys take seconds each; Jest's per-project `testTimeout` is not honoured.
jest.setTimeout(120_000);
