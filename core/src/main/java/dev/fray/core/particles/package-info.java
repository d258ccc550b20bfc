/** Structure-of-arrays particle store with named channels. */
package dev.fray.core.particles;
