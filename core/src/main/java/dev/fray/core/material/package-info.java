/** Plugin interface for constitutive laws and the particle data they see. */
package dev.fray.core.material;
