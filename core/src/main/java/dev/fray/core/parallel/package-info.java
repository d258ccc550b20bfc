/** Simulation-owned worker threads with thread-count-independent task partitions. */
package dev.fray.core.parallel;
