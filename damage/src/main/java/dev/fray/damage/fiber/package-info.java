/** Fiber families: the channel convention, the fiber-reinforced law and the fields that give a body its grain. */
package dev.fray.damage.fiber;
