/**
 * Standard benchmark scenes and their timing harness ({@link dev.fray.examples.bench.StandardBench}), run by
 * {@code fray bench}.
 */
package dev.fray.examples.bench;
