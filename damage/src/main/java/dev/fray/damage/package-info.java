/**
 * Constitutive laws and damage models that plug into core's interfaces. Start from the static factories, such as
 * {@link dev.fray.damage.Elastic}; the concrete classes live in sub-packages.
 */
package dev.fray.damage;
