/**
 * Providers that make this module's material laws ({@link dev.fray.core.plugin.MaterialLawProvider}) and damage
 * models ({@link dev.fray.core.plugin.DamageModelProvider}) available to scene files by name through
 * {@link dev.fray.core.plugin.PluginRegistry}. Each is listed in the matching file under
 * {@code META-INF/services}, reads its named parameters (SI units) and rejects unknown ones with a did-you-mean
 * suggestion.
 */
package dev.fray.damage.plugin;
