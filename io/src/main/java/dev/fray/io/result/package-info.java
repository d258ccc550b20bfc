/**
 * Figures computed from a run's particles for people reading its results: the width of the band of partly
 * damaged material around the cracks ({@link dev.fray.io.result.CrackBand}). They read views and frames only,
 * never the step.
 */
package dev.fray.io.result;
