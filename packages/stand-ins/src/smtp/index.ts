// Filled when the mail stand-in moves here from apps/api/src/fakes.
