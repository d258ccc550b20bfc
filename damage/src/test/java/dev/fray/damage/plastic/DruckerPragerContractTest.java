package dev.fray.damage.plastic;

import dev.fray.core.material.MaterialLaw;
import dev.fray.core.material.MaterialLawContract;
import dev.fray.damage.Plastic;

/**
 * Runs the material-law contract against {@link DruckerPrager} (Drucker-Prager plasticity with cohesion):
 * energy and stresses are those of the elastic part, so P = dpsi/dF, objectivity and the splits hold as for an
 * elastic law, and the projection keeps to its range and reports success on sound states.
 */
class DruckerPragerContractTest extends MaterialLawContract {
    @Override
    protected MaterialLaw createLaw() {
        return Plastic.druckerPrager(1e6, 0.3, 1600.0, 30, 500);
    }
}
