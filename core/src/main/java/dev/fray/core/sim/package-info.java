/** Scene description, the fluent builder, the simulation and its run loop with listeners. */
package dev.fray.core.sim;
