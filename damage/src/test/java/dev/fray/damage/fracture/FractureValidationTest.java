package dev.fray.damage.fracture;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.damage.DamageModel;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.material.ArrayMaterialState;
import dev.fray.core.particles.ChannelSpec;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Fracture;
import dev.fray.damage.fiber.FiberChannels;
import java.util.List;
import java.util.function.Supplier;
import org.junit.jupiter.api.Test;

/** Parameter validation, length-scale resolution and truthful channel declarations (common practice, no source). */
class FractureValidationTest extends FrayTestBase {
    private static void rejects(FrayMessage key, String field, Supplier<?> make) {
        InvalidInputException e = assertThrows(InvalidInputException.class, make::get);
        assertEquals(key, e.key(), e.getMessage());
        assertTrue(e.parts()[0].toString().startsWith(field), "names " + field + ": " + e.getMessage());
    }

    @Test
    void badPhaseFieldParametersNameTheFieldAndRange() {
        rejects(FrayMessage.MISSING, "fractureEnergy", () -> Fracture.phaseField().build());
        rejects(FrayMessage.OUT_OF_RANGE, "fractureEnergy", () -> Fracture.phaseField().fractureEnergy(0).build());
        rejects(FrayMessage.OUT_OF_RANGE, "lengthScale",
                () -> Fracture.phaseField().fractureEnergy(1).lengthScale(-1).build());
        rejects(FrayMessage.OUT_OF_RANGE, "viscosity",
                () -> Fracture.phaseField().fractureEnergy(1).viscosity(-1).build());
        rejects(FrayMessage.OUT_OF_RANGE, "residualStiffness",
                () -> Fracture.phaseField().fractureEnergy(1).residualStiffness(0.2).build());
        rejects(FrayMessage.NOT_FINITE, "residualStiffness",
                () -> Fracture.phaseField().fractureEnergy(1).residualStiffness(Double.NaN).build());
        rejects(FrayMessage.MISSING, "fiberStrengths",
                () -> Fracture.anisotropicPhaseField().fractureEnergy(1).build());
        rejects(FrayMessage.OUT_OF_RANGE, "number of fiberStrengths",
                () -> Fracture.anisotropicPhaseField().fractureEnergy(1).fiberStrengths(1, 2, 3, 4).build());
        rejects(FrayMessage.OUT_OF_RANGE, "fiberStrength2",
                () -> Fracture.anisotropicPhaseField().fractureEnergy(1).fiberStrengths(1, -2).build());
        rejects(FrayMessage.OUT_OF_RANGE, "criticalStressAcross", () -> Fracture.anisotropicPhaseField()
                .fractureEnergy(1).fiberStrengths(1).stressDriving(1e6, 0).build());
        rejects(FrayMessage.MISSING, "fractureEnergy", () -> Fracture.phaseFieldAT1().build());
        rejects(FrayMessage.INCONSISTENT, "fractureEnergy and strength",
                () -> Fracture.phaseFieldAT1().fractureEnergy(1).strength(1e4, 1e6).build());
        rejects(FrayMessage.OUT_OF_RANGE, "strength", () -> Fracture.phaseFieldAT1().strength(-1, 1e6).build());
        rejects(FrayMessage.OUT_OF_RANGE, "youngsModulus", () -> Fracture.phaseField().strength(1e4, 0).build());
        rejects(FrayMessage.INCONSISTENT, "strength", () -> Fracture.anisotropicPhaseField().strength(1e4, 1e6)
                .fiberStrengths(1).stressDriving(1e6, 1e5).build());
    }

    @Test
    void badRankineParametersNameTheFieldAndRange() {
        rejects(FrayMessage.MISSING, "criticalStress", () -> Fracture.rankine().softeningStress(1).build());
        rejects(FrayMessage.MISSING, "softeningStress", () -> Fracture.rankine().criticalStress(1e5).build());
        rejects(FrayMessage.INCONSISTENT, "softeningStress", () -> Fracture.rankine().criticalStress(1e5)
                .softeningStress(1e4).fractureEnergy(1, 1e9).build());
        rejects(FrayMessage.OUT_OF_RANGE, "viscosity",
                () -> Fracture.rankine().criticalStress(1e5).softeningStress(1e4).viscosity(-1).build());
        rejects(FrayMessage.OUT_OF_RANGE, "youngsModulus",
                () -> Fracture.rankine().criticalStress(1e5).fractureEnergy(1, -1).build());
        // h sigma_c^2/(2E) = 0.01 * 1e10 / 2e9 = 0.05 J/m^2: a smaller Gf would snap back
        rejects(FrayMessage.OUT_OF_RANGE, "fractureEnergy",
                () -> Fracture.rankine().criticalStress(1e5).fractureEnergy(0.04, 1e9).bandWidth(0.01).build());
        DamageModel late = Fracture.rankine().criticalStress(1e5).fractureEnergy(0.04, 1e9).build();
        rejects(FrayMessage.OUT_OF_RANGE, "fractureEnergy", () -> late.resolvedFor(0.01));
        // On a finer grid the band is narrower and the same Gf is enough.
        assertTrue(((RankineDamage) late.resolvedFor(0.005)).softeningStress() > 0, "fine enough grid resolves");
    }

    @Test
    void lengthScaleDefaultsToTwoCellsAndMayNotBeBelowOne() {
        PhaseFieldAT2 m = (PhaseFieldAT2) Fracture.phaseField().fractureEnergy(1).build().resolvedFor(0.01);
        assertEquals(0.02, m.lengthScale(), 1e-15);
        DamageModel thin = Fracture.phaseField().fractureEnergy(1).lengthScale(0.005).build();
        InvalidInputException e = assertThrows(InvalidInputException.class, () -> thin.resolvedFor(0.01));
        assertEquals(FrayMessage.OUT_OF_RANGE, e.key());
        assertTrue(e.getMessage().contains("cannot resolve"), e.getMessage());
        DamageModel ok = Fracture.phaseField().fractureEnergy(1).lengthScale(0.01).build();
        assertSame(ok, ok.resolvedFor(0.01), "one cell is allowed");
        DamageModel an = Fracture.anisotropicPhaseField().fractureEnergy(1).fiberStrengths(3).lengthScale(0.005)
                .build();
        assertThrows(InvalidInputException.class, () -> an.resolvedFor(0.01));
        DamageModel unresolved = Fracture.phaseField().fractureEnergy(1).build();
        double[] f = {1, 0, 0, 0, 1, 0, 0, 0, 1};
        ArrayMaterialState s = new ArrayMaterialState(f).withChannel(DamageModel.DAMAGE, new double[1])
                .withChannel(PhaseFieldAT2.HISTORY, new double[1]);
        assertThrows(IllegalStateException.class, () -> unresolved.phaseFieldCoefficients(s, 0, 1, 1e-3,
                new double[DamageModel.COEFFICIENTS]));
    }

    @Test
    void channelDeclarationsAreTruthful() {
        List<ChannelSpec> at2 = Fracture.phaseField().fractureEnergy(1).build().channels();
        assertEquals(List.of(DamageModel.DAMAGE, PhaseFieldAT2.HISTORY), at2.stream().map(ChannelSpec::name).toList());
        List<ChannelSpec> an = Fracture.anisotropicPhaseField().fractureEnergy(1).fiberStrengths(1, 2).build()
                .channels();
        assertEquals(List.of(DamageModel.DAMAGE, PhaseFieldAT2.HISTORY, FiberChannels.reference(1),
                FiberChannels.reference(2)), an.stream().map(ChannelSpec::name).toList());
        List<ChannelSpec> r = Fracture.rankine().criticalStress(1).softeningStress(1).build().channels();
        assertEquals(List.of(DamageModel.DAMAGE, RankineDamage.HISTORY), r.stream().map(ChannelSpec::name).toList());
        List<ChannelSpec> at1 = Fracture.phaseFieldAT1().fractureEnergy(1).build().channels();
        assertEquals(List.of(DamageModel.DAMAGE, PhaseFieldAT2.HISTORY, PhaseFieldSupport.TRIAL),
                at1.stream().map(ChannelSpec::name).toList());
        assertEquals(-1.0, at1.get(2).initial(), "the first AT1 solve is penalised everywhere");
        for (List<ChannelSpec> list : List.of(at2, an, r, at1)) {
            assertEquals(1, list.get(0).width(), "damage has width 1");
        }
    }

    @Test
    void emptyRangeIsANoOp() {
        for (DamageModel m : List.of(Fracture.phaseField().fractureEnergy(1).lengthScale(1).build(),
                Fracture.phaseFieldAT1().fractureEnergy(1).lengthScale(1).build(),
                Fracture.anisotropicPhaseField().fractureEnergy(1).lengthScale(1).fiberStrengths(1).build(),
                Fracture.rankine().criticalStress(1).softeningStress(1).build())) {
            double[] f = {1, 0, 0, 0, 1, 0, 0, 0, 1};
            ArrayMaterialState s = new ArrayMaterialState(f).withChannel(DamageModel.DAMAGE, new double[1])
                    .withChannel(PhaseFieldAT2.HISTORY, new double[1]).withChannel(RankineDamage.HISTORY,
                            new double[1]).withChannel(FiberChannels.reference(1), new double[3])
                    .withChannel(PhaseFieldSupport.TRIAL, new double[1]);
            double[] none = new double[0];
            m.update(s, 1, 1, 1e-3, none, none, none, none);
            m.degradation(s, 1, 1, none);
            m.phaseFieldCoefficients(s, 1, 1, 1e-3, none);
            m.acceptPhaseField(s, 1, 1, none);
        }
    }
}
