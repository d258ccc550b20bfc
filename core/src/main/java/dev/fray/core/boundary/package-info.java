/** Shapes, obstacles, grips, prescribed motions and contact laws. */
package dev.fray.core.boundary;
