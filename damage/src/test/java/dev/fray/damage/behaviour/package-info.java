/**
 * Fracture behaviour checks (VALIDATION.md section C): whole simulations of thin strips that crack, compared with
 * trends of common practice (crack paths along fibers, strength and ringing with stiffness, crack speed with
 * viscosity) and with the energy balance. {@link dev.fray.damage.behaviour.Strip} builds the specimens.
 */
package dev.fray.damage.behaviour;
