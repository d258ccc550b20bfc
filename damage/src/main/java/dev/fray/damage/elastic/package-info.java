/**
 * Isotropic hyperelastic laws: fixed corotated (Stomakhin et al. 2012), compressible Neo-Hookean (Bonet and Wood)
 * and St. Venant-Kirchhoff on Hencky (logarithmic) strain, all built from {@link
 * dev.fray.damage.elastic.ElasticParameters} (Young's modulus in Pa, Poisson ratio, density in kg/m^3). The laws
 * are immutable, hold no per-particle state and stay finite for inverted deformation gradients, as each class
 * documents.
 */
package dev.fray.damage.elastic;
