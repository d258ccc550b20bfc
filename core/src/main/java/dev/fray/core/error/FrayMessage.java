package dev.fray.core.error;

import java.text.MessageFormat;

/**
 * Catalogue of every message Fray reports to a user. Patterns are English {@link MessageFormat} strings;
 * values travel as parts of the exception and are formatted lazily. Tests assert on the key, never on text.
 */
public enum FrayMessage {
    /** A number outside its allowed range: {0} field, {1} value, {2} allowed range (with unit). */
    OUT_OF_RANGE("{0} = {1} is out of range: allowed {2}"),
    /** A number that must be finite: {0} field, {1} value. */
    NOT_FINITE("{0} = {1} must be a finite number"),
    /** A required value missing: {0} field. */
    MISSING("{0} is required but was not given"),
    /** Two settings that contradict each other: {0} field, {1} explanation. */
    INCONSISTENT("{0}: {1}"),
    /** A body whose particles fall outside the simulation domain: {0} body, {1} body bounds, {2} domain bounds. */
    BODY_OUTSIDE_DOMAIN("body \"{0}\" with bounds {1} does not lie inside the domain {2}; enlarge the domain or move the body"),
    /** A body that produced no particles: {0} body, {1} spacing. */
    BODY_EMPTY("body \"{0}\" holds no particle at spacing {1} m; use a smaller spacing or a larger shape"),
    /** A name not found in a registry: {0} kind, {1} name, {2} known names. */
    UNKNOWN_NAME("unknown {0} \"{1}\"; known: {2}"),
    /** A file that could not be read or written: {0} file, {1} reason. */
    FILE_ERROR("{0}: {1}"),
    /**
     * The simulation blew up: {0} reason, {1} body, {2} particle id, {3} step, {4} time in s, {5} suggested fix.
     */
    DIVERGED("simulation diverged ({0}) at body \"{1}\", particle {2}, step {3}, t = {4} s; {5}"),
    /**
     * A scene part that the implicit integrator does not handle: {0} the part, {1} why, {2} what to use instead.
     */
    IMPLICIT_UNSUPPORTED("{0} cannot run with run.integration = implicit: {1}; {2}"),
    /** A run was asked for that cannot run: {0} explanation. */
    ILLEGAL_STATE("{0}"),
    /** A bug inside Fray: {0} explanation. */
    INTERNAL("internal error: {0}");

    private final String pattern;

    FrayMessage(String pattern) {
        this.pattern = pattern;
    }

    /** @return the English {@link MessageFormat} pattern of this message */
    public String pattern() {
        return pattern;
    }

    /**
     * Formats this message with the given parts; falls back to the raw pattern if formatting fails.
     *
     * @param parts values for the placeholders (input, not modified)
     * @return the formatted English text
     */
    public String format(Object... parts) {
        try {
            Object[] shown = new Object[parts.length];
            for (int i = 0; i < parts.length; i++) {
                // MessageFormat would group digits of numbers ("1,000"); show them plainly.
                shown[i] = parts[i] instanceof Number ? String.valueOf(parts[i]) : parts[i];
            }
            return new MessageFormat(pattern.replace("'", "''"), java.util.Locale.ROOT).format(shown);
        } catch (RuntimeException e) {
            return pattern;
        }
    }

    /** @return how many distinct placeholders the pattern uses */
    public int placeholderCount() {
        int max = -1;
        for (int i = 0; i + 2 < pattern.length() + 1; i++) {
            if (pattern.charAt(i) == '{') {
                int end = pattern.indexOf('}', i);
                if (end > i) {
                    max = Math.max(max, Integer.parseInt(pattern.substring(i + 1, end)));
                }
            }
        }
        return max + 1;
    }
}
