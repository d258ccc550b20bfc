/** Fray's exception hierarchy, message catalogue and argument checks. */
package dev.fray.core.error;
