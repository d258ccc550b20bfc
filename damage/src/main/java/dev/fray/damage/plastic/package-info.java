/**
 * Plastic laws on Hencky strain: von Mises (J2) with linear isotropic hardening, Drucker-Prager for granular matter
 * (Klar et al. 2016) and non-associated Cam-Clay with hardening (Wolper et al. 2019). Each keeps the elastic part of
 * the deformation gradient in the particle's F, projects it after every step with a return mapping in principal
 * logarithmic strain, and keeps its plastic state in the channels {@code plastic-strain} and
 * {@code plastic-volume}. Parameters are in engineering terms (Pa, degrees), validated with the field named.
 * Start from the factories in {@link dev.fray.damage.Plastic}.
 */
package dev.fray.damage.plastic;
