/** Particle-grid interpolation kernels (B-splines). */
package dev.fray.core.kernel;
