package dev.fray.damage.plastic;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialLawContract;
import dev.fray.damage.Plastic;

/**
 * Runs the material-law contract against {@link CamClay} (non-associated Cam-Clay):
 * energy and stresses are those of the elastic part, so P = dpsi/dF, objectivity and the splits hold as for an
 * elastic law, and the projection keeps to its range and reports success on sound states.
 */
class CamClayContractTest extends MaterialLawContract {
    @Override
    protected MaterialLaw createLaw() {
        return Plastic.camClay(1e6, 0.3, 1000.0, 30, 5e4, 0.2, 2);
    }
}
