/** Plugin interface for damage models and the grid solve of phase-field damage. */
package dev.fray.core.damage;
