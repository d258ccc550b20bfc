/**
 * Checks of the core solver (grid, transfers, time stepping, boundaries) against published solutions. They need a
 * real constitutive law, so they live beside the laws rather than in core.
 */
package dev.fray.damage.solverchecks;
