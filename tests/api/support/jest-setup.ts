// Password hashing and a real database make some API tests slower than Jest's 5 s default.
jest.setTimeout(30_000);
