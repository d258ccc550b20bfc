package dev.fray.core.material;

/**
 * How a damaged law divides its stress and energy into the part damage degrades (tension) and the part it keeps
 * (compression), so that broken material still resists interpenetration. The damage model chooses one; the
 * material law implements it.
 */
public enum TensionSplit {
    /** Whatever the law does by default (see the law's documentation). */
    LAW_DEFAULT,
    /**
     * Volumetric-deviatoric split (Amor, Marigo and Maurini 2009): the deviatoric part and volumetric expansion are
     * degraded, volumetric compression is kept.
     */
    VOLUMETRIC_DEVIATORIC,
    /**
     * Spectral split (Miehe, Hofacker and Welschinger 2010): the positive principal strains are degraded, the
     * negative ones kept.
     */
    SPECTRAL,
    /** No split: all of the stress and energy is degraded, compression included. */
    NONE;

    /** @return the name scene files and plugin parameters use: lower case with dashes, e.g. "spectral" */
    public String key() {
        return name().toLowerCase(java.util.Locale.ROOT).replace('_', '-');
    }
}
