/** Sparse blocked background grid. */
package dev.fray.core.grid;
