export * from './fuel';
export * from './tyre';
export * from './drivetrain';
export * from './power';
export * from './vin';
export * from './vehicle.schemas';
