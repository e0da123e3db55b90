export * from './money';
export * from './plans';
export * from './subscription.rules';
export * from './mrr';
export * from './ledger.rules';
export * from './billing.schemas';
export * from './plan-limits.rules';
export * from './download-lock.rules';
