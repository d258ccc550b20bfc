package dev.fray.core.error;

/** Argument checks that report the field, the value and the allowed range. Run once at the edges, never per particle. */
public final class Checks {
    private Checks() {
    }

    /**
     * @param field name of the field as the user knows it, with unit, e.g. "youngsModulus (Pa)"
     * @param value the value
     * @return value if finite
     * @throws InvalidInputException if the value is NaN or infinite
     */
    public static double finite(String field, double value) {
        if (!Double.isFinite(value)) {
            throw new InvalidInputException(FrayMessage.NOT_FINITE, field, value);
        }
        return value;
    }

    /**
     * @param field name of the field
     * @param value the value
     * @return value if finite and strictly positive
     * @throws InvalidInputException otherwise
     */
    public static double positive(String field, double value) {
        finite(field, value);
        if (!(value > 0)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field, value, "> 0");
        }
        return value;
    }

    /**
     * @param field name of the field
     * @param value the value
     * @return value if finite and not negative
     * @throws InvalidInputException otherwise
     */
    public static double nonNegative(String field, double value) {
        finite(field, value);
        if (!(value >= 0)) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field, value, ">= 0");
        }
        return value;
    }

    /**
     * Checks lo &lt;= value &lt;= hi (closed) or lo &lt; value &lt; hi where the flags say open.
     *
     * @param field  name of the field
     * @param value  the value
     * @param lo     lower bound
     * @param loOpen whether the lower bound is excluded
     * @param hi     upper bound
     * @param hiOpen whether the upper bound is excluded
     * @return value if inside
     * @throws InvalidInputException otherwise
     */
    public static double inRange(String field, double value, double lo, boolean loOpen, double hi, boolean hiOpen) {
        finite(field, value);
        boolean okLo = loOpen ? value > lo : value >= lo;
        boolean okHi = hiOpen ? value < hi : value <= hi;
        if (!okLo || !okHi) {
            String range = (loOpen ? "(" : "[") + lo + ", " + hi + (hiOpen ? ")" : "]");
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field, value, range);
        }
        return value;
    }

    /**
     * @param field name of the field
     * @param value the value
     * @param lo    smallest allowed
     * @param hi    largest allowed
     * @return value if lo &lt;= value &lt;= hi
     */
    public static int inRange(String field, int value, int lo, int hi) {
        if (value < lo || value > hi) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, field, value, "[" + lo + ", " + hi + "]");
        }
        return value;
    }

    /**
     * @param field name of the field
     * @param value the value
     * @param <T>   its type
     * @return value if not null
     */
    public static <T> T notNull(String field, T value) {
        if (value == null) {
            throw new InvalidInputException(FrayMessage.MISSING, field);
        }
        return value;
    }
}
