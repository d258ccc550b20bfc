package dev.fray.damage.fiber;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialState;
import dev.fray.core.material.TensionSplit;
import dev.fray.core.particles.ChannelSpec;

import java.util.ArrayList;
import java.util.List;

/**
 * Fiber-reinforced elasticity: an isotropic base law plus one to three fiber families, each with its own
 * {@link Term},
 * <pre>
 *   psi = psi_base(F) + sum_f psi_f(I4_f),        I4_f = |F a0_f|^2
 *   P   = P_base + sum_f 2 psi_f'(I4_f) (F a0_f) (x) a0_f
 *   tau = tau_base + sum_f 2 psi_f'(I4_f) (F a0_f) (F a0_f)^T
 * </pre>
 * where a0_f is the unit reference direction of family f, read from channel {@link FiberChannels#reference}
 * (width 3). The stress follows from dI4/dF = 2 F a0 (x) a0. Fibers resist stretch, not compression: psi_f and
 * its slope are zero for I4 &lt;= 1. A zero reference vector means the particle has no fiber of that family; a
 * non-zero one need not be exactly unit, since I4 is formed as |F a0|<sup>2</sup> / |a0|<sup>2</sup>.
 * Stresses in Pa, energies in J/m^3.
 *
 * <p>Damage: {@link #splitKirchhoffStress} is the base law's split, in whichever {@link TensionSplit} the damage
 * model asks for, plus the whole fiber stress and energy as degradable, since a broken fiber carries nothing, and a
 * fiber stress is never compressive anyway. The law offers exactly the splits its base law offers.
 *
 * <p>Current directions: {@link #projectsDeformation()} is true, and {@link #projectDeformation} writes
 * F a0 / |F a0| into {@link FiberChannels#current} for anisotropic damage models and output. It does not change F
 * (other than through the base law's own projection, if it has one, which runs first).
 *
 * <p>Wave speed: along a fiber at rest, F = I + e a0 (x) a0 gives I4 = 1 + 2e + e<sup>2</sup>, so each family adds
 * 2 k e<sup>2</sup> to the energy and 4 k to the P-wave modulus (k = k1 for the exponential term). The law reports
 * sqrt((M_base + 4 sum_f k_f) / rho) with M_base = rho c_base<sup>2</sup> the base law's P-wave modulus: the
 * exact small-strain value when all families are parallel, an upper bound otherwise. The exponential term
 * stiffens with stretch, so a stretched fiber carries faster waves than this value of the undeformed material.
 *
 * <p>Immutable and thread-safe; one virtual call to the base law per batch, none per particle.
 */
public final class FiberReinforced implements MaterialLaw {
    /** Registry name. */
    public static final String NAME = "fiber-reinforced";

    /**
     * The strain energy of one fiber family as a function of its squared stretch I4 = |F a0|<sup>2</sup> (a0 the
     * unit reference direction). Fibers resist stretch, not compression: for I4 &lt;= 1 the energy and its slope are
     * zero. Two kinds:
     * <pre>
     *   quadratic    psi_f = k/2 (I4 - 1)^2                         dpsi_f/dI4 = k (I4 - 1)
     *   exponential  psi_f = k1/(2 k2) (exp(k2 (I4 - 1)^2) - 1)     dpsi_f/dI4 = k1 (I4 - 1) exp(k2 (I4 - 1)^2)
     * </pre>
     * The exponential term is that of Holzapfel, Gasser and Ogden 2000 (J. Elasticity 61, <i>A new constitutive
     * framework for arterial wall mechanics</i>). k and k1 are stresses in Pa, k2 is dimensionless, psi_f is in
     * J/m^3.
     *
     * <p>Overflow guard: exp(k2 (I4 - 1)<sup>2</sup>) overflows a double near k2 (I4 - 1)<sup>2</sup> = 709, which a
     * torn fiber can reach in a simulation. Beyond k2 (I4 - 1)<sup>2</sup> = {@link #EXPONENT_CAP} the exponential
     * term is continued by its second-order Taylor polynomial in I4 at that point, so energy and slope stay finite and
     * continuous (C<sup>2</sup>). At the cap the fiber is more than e<sup>40</sup>, about 2e17, times stiffer than at
     * rest, which no physical fiber reaches; below it the term is exact.
     *
     * <p>Immutable and thread-safe. The law calls {@link #energy} and {@link #derivative} per particle; the class is
     * final, so these calls are statically bound, not virtual.
     */
    public static final class Term {
        /** The kind of fiber energy. */
        public enum Kind {
            /** psi_f = k/2 (I4 - 1)^2 for I4 &gt; 1, zero otherwise. */
            QUADRATIC,
            /** psi_f = k1/(2 k2) (exp(k2 (I4 - 1)^2) - 1) for I4 &gt; 1, zero otherwise (Holzapfel et al. 2000). */
            EXPONENTIAL
        }

        /**
         * Value of k2 (I4 - 1)<sup>2</sup> beyond which the exponential term is continued by a polynomial
         * (dimensionless); see the class comment.
         */
        public static final double EXPONENT_CAP = 40.0;

        private final Kind kind;
        private final double stiffness;
        private final double exponent;
        /** Exponential kind: I4 - 1 at the cap, and the energy, slope and curvature (in I4) there. */
        private final double capStrain;
        private final double capEnergy;
        private final double capSlope;
        private final double capCurvature;

        private Term(Kind kind, double stiffness, double exponent) {
            this.kind = kind;
            this.stiffness = stiffness;
            this.exponent = exponent;
            if (kind == Kind.EXPONENTIAL) {
                double d = Math.sqrt(EXPONENT_CAP / exponent);
                double e = Math.exp(EXPONENT_CAP);
                capStrain = d;
                capEnergy = stiffness * Math.expm1(EXPONENT_CAP) / (2.0 * exponent);
                capSlope = stiffness * d * e;
                capCurvature = stiffness * e * (1.0 + 2.0 * EXPONENT_CAP);
            } else {
                capStrain = Double.POSITIVE_INFINITY;
                capEnergy = 0.0;
                capSlope = 0.0;
                capCurvature = 0.0;
            }
        }

        /**
         * The quadratic fiber-stretch term psi_f = k/2 (I4 - 1)<sup>2</sup> for I4 &gt; 1.
         *
         * @param stiffness k, Pa, finite and &gt; 0
         * @return the term
         * @throws dev.fray.core.error.InvalidInputException (OUT_OF_RANGE, NOT_FINITE) naming "fiber stiffness k (Pa)"
         */
        public static Term quadratic(double stiffness) {
            Checks.positive("fiber stiffness k (Pa)", stiffness);
            return new Term(Kind.QUADRATIC, stiffness, 0.0);
        }

        /**
         * The exponential term of Holzapfel, Gasser and Ogden 2000,
         * psi_f = k1/(2 k2) (exp(k2 (I4 - 1)<sup>2</sup>) - 1) for I4 &gt; 1.
         *
         * @param k1 stiffness, Pa, finite and &gt; 0
         * @param k2 dimensionless exponent, finite and &gt; 0
         * @return the term
         * @throws dev.fray.core.error.InvalidInputException (OUT_OF_RANGE, NOT_FINITE) naming "fiber stiffness k1 (Pa)"
         *         or "fiber exponent k2"
         */
        public static Term exponential(double k1, double k2) {
            Checks.positive("fiber stiffness k1 (Pa)", k1);
            Checks.positive("fiber exponent k2", k2);
            return new Term(Kind.EXPONENTIAL, k1, k2);
        }

        /** @return the kind of term */
        public Kind kind() {
            return kind;
        }

        /** @return k (quadratic) or k1 (exponential), Pa */
        public double stiffness() {
            return stiffness;
        }

        /** @return k2 (exponential, dimensionless), 0 for the quadratic term */
        public double exponent() {
            return exponent;
        }

        /**
         * Stiffness the term adds to uniaxial strain along the fiber at rest: for F = I + e a0 (x) a0,
         * I4 = (1 + e)<sup>2</sup> = 1 + 2e + e<sup>2</sup> and psi_f = 2 k e<sup>2</sup> + O(e<sup>3</sup>) for both
         * kinds (k = k1 for the exponential, whose exp(k2 (2e)<sup>2</sup>) - 1 = 4 k2 e<sup>2</sup> + ...), so the
         * P-wave modulus along the fiber grows by 4 k.
         *
         * @return k (quadratic) or k1 (exponential), Pa
         */
        public double smallStrainStiffness() {
            return stiffness;
        }

        /**
         * Energy density of the term.
         *
         * @param i4 squared fiber stretch |F a0|<sup>2</sup>, dimensionless
         * @return psi_f, J/m^3; 0 for i4 &lt;= 1; NaN for NaN
         */
        public double energy(double i4) {
            double d = i4 - 1.0;
            if (d <= 0.0) {
                return 0.0;
            }
            if (kind == Kind.QUADRATIC) {
                return 0.5 * stiffness * d * d;
            }
            if (d <= capStrain) {
                // expm1 keeps the small-strain energy accurate where exp(x) - 1 would cancel
                return stiffness * Math.expm1(exponent * d * d) / (2.0 * exponent);
            }
            double x = d - capStrain;
            return capEnergy + capSlope * x + 0.5 * capCurvature * x * x;
        }

        /**
         * Slope of the energy in I4.
         *
         * @param i4 squared fiber stretch |F a0|<sup>2</sup>, dimensionless
         * @return dpsi_f/dI4, Pa; 0 for i4 &lt;= 1; NaN for NaN
         */
        public double derivative(double i4) {
            double d = i4 - 1.0;
            if (d <= 0.0) {
                return 0.0;
            }
            if (kind == Kind.QUADRATIC) {
                return stiffness * d;
            }
            if (d <= capStrain) {
                return stiffness * d * Math.exp(exponent * d * d);
            }
            return capSlope + capCurvature * (d - capStrain);
        }

        /**
         * Curvature of the energy in I4, for the stress differential.
         *
         * @param i4 squared fiber stretch |F a0|<sup>2</sup>, dimensionless
         * @return d<sup>2</sup>psi_f/dI4<sup>2</sup>, Pa; 0 for i4 &lt;= 1; NaN for NaN
         */
        public double curvature(double i4) {
            double d = i4 - 1.0;
            if (d <= 0.0) {
                return 0.0;
            }
            if (kind == Kind.QUADRATIC) {
                return stiffness;
            }
            if (d <= capStrain) {
                return stiffness * Math.exp(exponent * d * d) * (1.0 + 2.0 * exponent * d * d);
            }
            return capCurvature;
        }

        /** @return whether o is a term of the same kind and constants */
        @Override
        public boolean equals(Object o) {
            return o instanceof Term t && t.kind == kind && Double.compare(t.stiffness, stiffness) == 0
                    && Double.compare(t.exponent, exponent) == 0;
        }

        /** @return a hash of kind and constants */
        @Override
        public int hashCode() {
            return (kind.hashCode() * 31 + Double.hashCode(stiffness)) * 31 + Double.hashCode(exponent);
        }

        /** @return the kind and constants, for diagnostics */
        @Override
        public String toString() {
            return kind == Kind.QUADRATIC ? "quadratic[k=" + stiffness + " Pa]"
                    : "exponential[k1=" + stiffness + " Pa, k2=" + exponent + "]";
        }
    }

    private final MaterialLaw base;
    private final Term[] terms;
    private final String[] referenceNames;
    private final String[] currentNames;
    private final List<ChannelSpec> channels;
    private final double waveSpeed;

    /**
     * @param base  isotropic base law (kept); its channels must not use the fiber channel names
     * @param terms one term per family, family k + 1 at index k, 1 to {@link FiberChannels#MAX_FAMILIES} of them
     *              (copied)
     * @throws InvalidInputException MISSING for a null base, list or term, OUT_OF_RANGE for a number of families
     *         outside [1, 3], INCONSISTENT if the base law already declares a fiber channel
     */
    public FiberReinforced(MaterialLaw base, List<Term> terms) {
        this.base = Checks.notNull("base material law", base);
        Checks.notNull("fiber terms", terms);
        Checks.inRange("number of fiber families", terms.size(), 1, FiberChannels.MAX_FAMILIES);
        int n = terms.size();
        this.terms = new Term[n];
        this.referenceNames = new String[n];
        this.currentNames = new String[n];
        List<ChannelSpec> specs = new ArrayList<>(base.channels());
        double added = 0.0;
        for (int k = 0; k < n; k++) {
            this.terms[k] = Checks.notNull("fiber family " + (k + 1) + " term", terms.get(k));
            referenceNames[k] = FiberChannels.reference(k + 1);
            currentNames[k] = FiberChannels.current(k + 1);
            for (ChannelSpec s : base.channels()) {
                if (s.name().equals(referenceNames[k]) || s.name().equals(currentNames[k])) {
                    throw new InvalidInputException(FrayMessage.INCONSISTENT, "fiber family " + (k + 1),
                            "base law \"" + base.name() + "\" already declares channel \"" + s.name()
                                    + "\"; add all families in one fiber-reinforced law");
                }
            }
            specs.add(FiberChannels.referenceSpec(k + 1));
            specs.add(FiberChannels.currentSpec(k + 1));
            added += 4.0 * this.terms[k].smallStrainStiffness();
        }
        this.channels = List.copyOf(specs);
        double rho = base.density();
        double c = base.waveSpeed();
        this.waveSpeed = Math.sqrt((rho * c * c + added) / rho);
    }

    /** @return the isotropic base law */
    public MaterialLaw base() {
        return base;
    }

    /** @return the terms, family k + 1 at index k, unmodifiable */
    public List<Term> terms() {
        return List.of(terms);
    }

    /** @return number of fiber families, 1 to 3 */
    public int families() {
        return terms.length;
    }

    /** {@inheritDoc} */
    @Override
    public String name() {
        return NAME;
    }

    /** {@inheritDoc} The base law's density. */
    @Override
    public double density() {
        return base.density();
    }

    /** {@inheritDoc} sqrt((M_base + 4 sum_f k_f) / rho); see the class comment for the derivation. */
    @Override
    public double waveSpeed() {
        return waveSpeed;
    }

    /** {@inheritDoc} The base law's channels, then "fiber-k" and "fiber-k-current" for each family k. */
    @Override
    public List<ChannelSpec> channels() {
        return channels;
    }

    /** {@inheritDoc} */
    @Override
    public void energyDensity(MaterialState state, int from, int to, double[] out) {
        base.energyDensity(state, from, to, out);
        double[] f = state.deformation();
        for (int k = 0; k < terms.length; k++) {
            Term t = terms[k];
            double[] a = state.channel(referenceNames[k]);
            for (int p = from; p < to; p++) {
                int i = 9 * p;
                int q = 3 * p;
                double ax = a[q], ay = a[q + 1], az = a[q + 2];
                double n2 = ax * ax + ay * ay + az * az;
                if (n2 == 0.0) {
                    continue; // no fiber of this family here
                }
                double fx = f[i] * ax + f[i + 1] * ay + f[i + 2] * az;
                double fy = f[i + 3] * ax + f[i + 4] * ay + f[i + 5] * az;
                double fz = f[i + 6] * ax + f[i + 7] * ay + f[i + 8] * az;
                out[p - from] += t.energy((fx * fx + fy * fy + fz * fz) / n2);
            }
        }
    }

    /** {@inheritDoc} */
    @Override
    public void firstPiolaKirchhoff(MaterialState state, int from, int to, double[] out) {
        base.firstPiolaKirchhoff(state, from, to, out);
        double[] f = state.deformation();
        for (int k = 0; k < terms.length; k++) {
            Term t = terms[k];
            double[] a = state.channel(referenceNames[k]);
            for (int p = from; p < to; p++) {
                int i = 9 * p;
                int q = 3 * p;
                int o = 9 * (p - from);
                double ax = a[q], ay = a[q + 1], az = a[q + 2];
                double n2 = ax * ax + ay * ay + az * az;
                if (n2 == 0.0) {
                    continue;
                }
                double fx = f[i] * ax + f[i + 1] * ay + f[i + 2] * az;
                double fy = f[i + 3] * ax + f[i + 4] * ay + f[i + 5] * az;
                double fz = f[i + 6] * ax + f[i + 7] * ay + f[i + 8] * az;
                double i4 = (fx * fx + fy * fy + fz * fz) / n2;
                if (i4 <= 1.0) {
                    continue; // fibers carry no compression (NaN falls through and propagates)
                }
                // dI4/dF = 2 (F a) (x) a / |a|^2 for a non-unit a
                double c = 2.0 * t.derivative(i4) / n2;
                double cx = c * fx, cy = c * fy, cz = c * fz;
                out[o] += cx * ax;
                out[o + 1] += cx * ay;
                out[o + 2] += cx * az;
                out[o + 3] += cy * ax;
                out[o + 4] += cy * ay;
                out[o + 5] += cy * az;
                out[o + 6] += cz * ax;
                out[o + 7] += cz * ay;
                out[o + 8] += cz * az;
            }
        }
    }

    /** {@inheritDoc} The base law's tau plus 2 psi_f' (F a0)(F a0)^T per family, exactly symmetric. */
    @Override
    public void kirchhoffStress(MaterialState state, int from, int to, double[] out) {
        base.kirchhoffStress(state, from, to, out);
        addFiberKirchhoff(state, from, to, out, null);
    }

    /**
     * {@inheritDoc}
     *
     * <p>The base law's split, plus every family's stress and energy on the degradable side.
     */
    @Override
    public void splitKirchhoffStress(MaterialState state, int from, int to, double[] tauDegraded, double[] tauKept,
                                     double[] psiDegraded, double[] psiKept) {
        base.splitKirchhoffStress(state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
        addFiberKirchhoff(state, from, to, tauDegraded, psiDegraded);
    }

    /**
     * {@inheritDoc}
     *
     * <p>The base law's split of the requested kind, plus every family's stress and energy on the degradable side.
     *
     * @throws UnsupportedOperationException if the base law does not offer the split
     */
    @Override
    public void splitKirchhoffStress(TensionSplit split, MaterialState state, int from, int to,
                                     double[] tauDegraded, double[] tauKept, double[] psiDegraded,
                                     double[] psiKept) {
        base.splitKirchhoffStress(split, state, from, to, tauDegraded, tauKept, psiDegraded, psiKept);
        addFiberKirchhoff(state, from, to, tauDegraded, psiDegraded);
    }

    /** {@inheritDoc} Whatever the base law offers. */
    @Override
    public boolean supportsSplit(TensionSplit split) {
        return base.supportsSplit(split);
    }

    /** {@inheritDoc} Whenever the base law does. */
    @Override
    public boolean hasStressDifferential() {
        return base.hasStressDifferential();
    }

    /**
     * {@inheritDoc}
     *
     * <p>The base law's differential plus, per family (all degradable, so scaled by g),
     * <pre>
     *   dP_f = c (dF a0) (x) a0 + 4 psi_f'' / |a0|^4 ((F a0) . (dF a0)) (F a0) (x) a0,   c = 2 psi_f' / |a0|^2
     * </pre>
     * Both terms are positive semi-definite already (psi_f' and psi_f'' are &gt;= 0 for both kinds), so the
     * projection needs nothing beyond the base law's.
     */
    @Override
    public void stressDifferential(MaterialState state, int from, int to, TensionSplit split, double[] degradation,
                                   boolean definite, double[] out) {
        base.stressDifferential(state, from, to, split, degradation, definite, out);
        boolean damaged = split != null && degradation != null;
        double[] f = state.deformation();
        double[] fa = new double[9];
        for (int k = 0; k < terms.length; k++) {
            Term t = terms[k];
            double[] a = state.channel(referenceNames[k]);
            for (int p = from; p < to; p++) {
                int i = 9 * p;
                int q = 3 * p;
                double ax = a[q], ay = a[q + 1], az = a[q + 2];
                double n2 = ax * ax + ay * ay + az * az;
                if (n2 == 0.0) {
                    continue;
                }
                double fx = f[i] * ax + f[i + 1] * ay + f[i + 2] * az;
                double fy = f[i + 3] * ax + f[i + 4] * ay + f[i + 5] * az;
                double fz = f[i + 6] * ax + f[i + 7] * ay + f[i + 8] * az;
                double i4 = (fx * fx + fy * fy + fz * fz) / n2;
                if (!(i4 > 1.0)) {
                    continue;
                }
                double w = damaged ? degradation[p - from] : 1.0;
                double c = w * 2.0 * t.derivative(i4) / n2;
                double r = w * 4.0 * t.curvature(i4) / (n2 * n2);
                double[] av = {ax, ay, az};
                double[] fv = {fx, fy, fz};
                // (F a0) (x) a0, flattened
                for (int x = 0; x < 3; x++) {
                    for (int y = 0; y < 3; y++) {
                        fa[3 * x + y] = fv[x] * av[y];
                    }
                }
                int o = DIFFERENTIAL_SIZE * (p - from);
                for (int x = 0; x < 9; x++) {
                    int row = o + 9 * x;
                    double rx = r * fa[x];
                    for (int y = 0; y < 9; y++) {
                        out[row + y] += rx * fa[y];
                    }
                }
                // c (I (x) a0 a0^T): dP_ab/dF_cd = c delta_ac a_b a_d
                for (int aa = 0; aa < 3; aa++) {
                    for (int b = 0; b < 3; b++) {
                        for (int d = 0; d < 3; d++) {
                            out[o + 9 * (3 * aa + b) + 3 * aa + d] += c * av[b] * av[d];
                        }
                    }
                }
            }
        }
    }

    /** Adds each family's tau to tau[9(p - from)] and, when psi is not null, its energy to psi[p - from]. */
    private void addFiberKirchhoff(MaterialState state, int from, int to, double[] tau, double[] psi) {
        double[] f = state.deformation();
        for (int k = 0; k < terms.length; k++) {
            Term t = terms[k];
            double[] a = state.channel(referenceNames[k]);
            for (int p = from; p < to; p++) {
                int i = 9 * p;
                int q = 3 * p;
                int o = 9 * (p - from);
                double ax = a[q], ay = a[q + 1], az = a[q + 2];
                double n2 = ax * ax + ay * ay + az * az;
                if (n2 == 0.0) {
                    continue;
                }
                double fx = f[i] * ax + f[i + 1] * ay + f[i + 2] * az;
                double fy = f[i + 3] * ax + f[i + 4] * ay + f[i + 5] * az;
                double fz = f[i + 6] * ax + f[i + 7] * ay + f[i + 8] * az;
                double i4 = (fx * fx + fy * fy + fz * fz) / n2;
                if (i4 <= 1.0) {
                    continue;
                }
                if (psi != null) {
                    psi[p - from] += t.energy(i4);
                }
                double c = 2.0 * t.derivative(i4) / n2;
                // upper triangle once, mirrored, so a symmetric base tau stays exactly symmetric
                double t00 = c * fx * fx, t01 = c * fx * fy, t02 = c * fx * fz;
                double t11 = c * fy * fy, t12 = c * fy * fz, t22 = c * fz * fz;
                tau[o] += t00;
                tau[o + 1] += t01;
                tau[o + 2] += t02;
                tau[o + 3] += t01;
                tau[o + 4] += t11;
                tau[o + 5] += t12;
                tau[o + 6] += t02;
                tau[o + 7] += t12;
                tau[o + 8] += t22;
            }
        }
    }

    /** {@inheritDoc} Always true: the current fiber directions are updated after every step. */
    @Override
    public boolean projectsDeformation() {
        return true;
    }

    /**
     * {@inheritDoc}
     *
     * <p>Runs the base law's projection first, if it has one, then writes each family's current direction
     * F a0 / |F a0| (dimensionless, unit) from the resulting F. F itself is not changed here. A zero reference
     * direction (no fiber) gives a zero current direction. Where F a0 is zero or not finite (a singular or
     * diverged F) the previous current direction is left in place, since no direction can be formed. Returns
     * the base law's failure, if any; writing directions cannot fail.
     */
    @Override
    public int projectDeformation(MaterialState state, int from, int to) {
        int failed = base.projectsDeformation() ? base.projectDeformation(state, from, to) : -1;
        double[] f = state.deformation();
        for (int k = 0; k < terms.length; k++) {
            double[] a = state.channel(referenceNames[k]);
            double[] cur = state.channel(currentNames[k]);
            for (int p = from; p < to; p++) {
                int i = 9 * p;
                int q = 3 * p;
                double ax = a[q], ay = a[q + 1], az = a[q + 2];
                if (ax == 0.0 && ay == 0.0 && az == 0.0) {
                    cur[q] = 0.0;
                    cur[q + 1] = 0.0;
                    cur[q + 2] = 0.0;
                    continue;
                }
                double fx = f[i] * ax + f[i + 1] * ay + f[i + 2] * az;
                double fy = f[i + 3] * ax + f[i + 4] * ay + f[i + 5] * az;
                double fz = f[i + 6] * ax + f[i + 7] * ay + f[i + 8] * az;
                double n = Math.sqrt(fx * fx + fy * fy + fz * fz);
                if (n > 0.0 && n < Double.POSITIVE_INFINITY) {
                    cur[q] = fx / n;
                    cur[q + 1] = fy / n;
                    cur[q + 2] = fz / n;
                }
            }
        }
        return failed;
    }

    /** @return the base law and the terms, for diagnostics */
    @Override
    public String toString() {
        return NAME + "[" + base + ", " + List.of(terms) + "]";
    }

}
