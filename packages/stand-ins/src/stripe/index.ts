// Filled when the payment stand-in moves here from apps/api/src/fakes.
