/**
 * A damage model written and registered the way a third-party jar would do it, and the test that it does
 * everything a built-in one does: found by the registry, built from named parameters, run, and exported.
 */
package dev.fray.examples.plugin;
