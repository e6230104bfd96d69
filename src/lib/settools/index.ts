/** Set tools: flicker-safe shutter arithmetic and a location power budget (pure, no framework imports). */
export * from './flicker';
export * from './power';
export * from './format';
export * from './storage';
