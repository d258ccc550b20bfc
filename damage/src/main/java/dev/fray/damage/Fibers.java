package dev.fray.damage;

import dev.fray.core.error.Checks;
import dev.fray.core.material.MaterialLaw;
import dev.fray.damage.fiber.FiberChannels;
import dev.fray.damage.fiber.FiberReinforced;

import java.util.ArrayList;
import java.util.List;

/**
 * Factories for fiber-reinforced laws: an isotropic base law plus one to three fiber families, each with a
 * quadratic or an exponential (Holzapfel, Gasser and Ogden 2000) fiber-stretch term. Fibers resist stretch, not
 * compression. Family k takes its reference directions from channel "fiber-k" (see
 * {@link FiberChannels}), typically filled from a {@link dev.fray.damage.fiber.FiberFields} field.
 *
 * <pre>
 *   MaterialLaw law = Fibers.reinforce(Elastic.neoHookean(1e6, 0.45, 1000))
 *           .quadratic(5e5)          // family 1: k = 0.5 MPa
 *           .exponential(1e5, 2.0)   // family 2: k1 = 0.1 MPa, k2 = 2
 *           .build();
 * </pre>
 */
public final class Fibers {
    private Fibers() {
    }

    /**
     * Starts a fiber-reinforced law.
     *
     * @param base isotropic base law, e.g. from {@link Elastic}
     * @return a builder; add one to three families, then call {@link Builder#build()}
     * @throws dev.fray.core.error.InvalidInputException MISSING if base is null
     */
    public static Builder reinforce(MaterialLaw base) {
        return new Builder(Checks.notNull("base material law", base));
    }

    /**
     * Collects fiber families in order (the first added is family 1, channel "fiber-1"). Not thread-safe; the
     * law it builds is. Parameters are validated in {@link #build()}.
     */
    public static final class Builder {
        private final MaterialLaw base;
        private final List<double[]> families = new ArrayList<>();

        private Builder(MaterialLaw base) {
            this.base = base;
        }

        /**
         * Adds a family with the quadratic term psi_f = k/2 (I4 - 1)<sup>2</sup> for I4 &gt; 1.
         *
         * @param stiffness k, Pa, finite and &gt; 0 (checked in {@link #build()})
         * @return this
         */
        public Builder quadratic(double stiffness) {
            families.add(new double[] {0, stiffness, 0});
            return this;
        }

        /**
         * Adds a family with the exponential term psi_f = k1/(2 k2) (exp(k2 (I4 - 1)<sup>2</sup>) - 1) for
         * I4 &gt; 1 (Holzapfel, Gasser and Ogden 2000).
         *
         * @param k1 stiffness, Pa, finite and &gt; 0 (checked in {@link #build()})
         * @param k2 dimensionless exponent, finite and &gt; 0 (checked in {@link #build()})
         * @return this
         */
        public Builder exponential(double k1, double k2) {
            families.add(new double[] {1, k1, k2});
            return this;
        }

        /**
         * Validates the families and makes the law.
         *
         * @return an immutable {@link FiberReinforced} law named "fiber-reinforced"
         * @throws dev.fray.core.error.InvalidInputException OUT_OF_RANGE for a number of families outside [1, 3]
         *         or a stiffness or exponent &lt;= 0, NOT_FINITE for NaN or infinite values (the field names the
         *         family, e.g. "fiber family 2: k1 (Pa)"), INCONSISTENT if the base law already has fibers
         */
        public MaterialLaw build() {
            Checks.inRange("number of fiber families", families.size(), 1, FiberChannels.MAX_FAMILIES);
            List<FiberReinforced.Term> terms = new ArrayList<>();
            for (int k = 0; k < families.size(); k++) {
                double[] fam = families.get(k);
                String field = "fiber family " + (k + 1) + ": ";
                if (fam[0] == 0) {
                    terms.add(FiberReinforced.Term.quadratic(Checks.positive(field + "k (Pa)", fam[1])));
                } else {
                    Checks.positive(field + "k1 (Pa)", fam[1]);
                    Checks.positive(field + "k2", fam[2]);
                    terms.add(FiberReinforced.Term.exponential(fam[1], fam[2]));
                }
            }
            return new FiberReinforced(base, terms);
        }
    }
}
