/**
 * Ampwright's engineering computations: pure functions, plain values in and out, units in the
 * names. Each function names the published source it implements; the team's REFERENCES.md
 * lists the values and how far each is confirmed.
 */
export * from './layout';
export * from './conductors';
export * from './loads';
export * from './voltage-drop';
export * from './thermal';
export * from './trip';
export * from './torque';
export * from './maintenance';
export * from './nuisance';
export * from './directory';
export * from './warnings';
export * from './safety';
export * from './fault';
export * from './capacity';
export * from './corrections';
export * from './measured';
export * from './thermography';
export * from './trip-plot';
