package dev.fray.core.testing;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialLawContract;

/**
 * The test-only law that core's solver tests use for stress passes the material-law contract (energy derivative,
 * objectivity, isotropy, Kirchhoff stress = P F^T), so those tests rest on a checked law.
 */
class SimpleNeoHookeanTest extends MaterialLawContract {
    @Override
    protected MaterialLaw createLaw() {
        return new SimpleNeoHookean(1e5, 0.3, 1000);
    }

    /** ln J has no value for J &lt;= 0 and this compact law does not continue it. */
    @Override
    protected boolean invertible() {
        return false;
    }
}
