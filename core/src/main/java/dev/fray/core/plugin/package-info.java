/** Finding material laws and damage models by name: providers, parameters and the per-host registry. */
package dev.fray.core.plugin;
