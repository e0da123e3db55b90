export * from './fuel';
export * from './tyre';
export * from './drivetrain';
