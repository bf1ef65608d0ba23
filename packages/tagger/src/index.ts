// Public surface of @tagloom/tagger. Anything not exported here is internal.
export * from "./random";
// -- text, encoding, column files and metrics (exports below this line) --
// -- model, decoding, training, serialization (exports below this line) --
