/**
 * Damage models that make bodies crack: local Rankine damage with exponential softening, and the AT1 and AT2 phase
 * fields ({@link dev.fray.damage.fracture.CrackDensity}; isotropic and with a fiber structural tensor) solved on the
 * grid by the simulation. Start from the factories in
 * {@link dev.fray.damage.Fracture}. All models are immutable and keep their per-particle state in channels.
 */
package dev.fray.damage.fracture;
