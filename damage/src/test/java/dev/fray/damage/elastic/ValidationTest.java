package dev.fray.damage.elastic;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.testing.FrayTestBase;
import dev.fray.damage.Elastic;
import org.junit.jupiter.api.Test;
import org.junit.jupiter.params.ParameterizedTest;
import org.junit.jupiter.params.provider.Arguments;
import org.junit.jupiter.params.provider.MethodSource;

import java.util.Arrays;
import java.util.List;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertNotNull;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

/**
 * Bad elastic constants are rejected with the catalogue key and the field name, whichever entry point is used.
 * Common practice, no source: E &gt; 0, rho &gt; 0 and -1 &lt; nu &lt; 1/2 are the bounds of positive definite
 * isotropic linear elasticity (published: Timoshenko and Goodier, Theory of Elasticity).
 */
class ValidationTest extends FrayTestBase {
    private static final double E = 1e6;
    private static final double NU = 0.3;
    private static final double RHO = 1000.0;

    static Stream<Arguments> badParameters() {
        return Stream.of(
                Arguments.of(-1e6, NU, RHO, FrayMessage.OUT_OF_RANGE, ElasticParameters.YOUNGS_MODULUS_FIELD),
                Arguments.of(0.0, NU, RHO, FrayMessage.OUT_OF_RANGE, ElasticParameters.YOUNGS_MODULUS_FIELD),
                Arguments.of(Double.NaN, NU, RHO, FrayMessage.NOT_FINITE, ElasticParameters.YOUNGS_MODULUS_FIELD),
                Arguments.of(Double.POSITIVE_INFINITY, NU, RHO, FrayMessage.NOT_FINITE,
                        ElasticParameters.YOUNGS_MODULUS_FIELD),
                Arguments.of(E, 0.5, RHO, FrayMessage.OUT_OF_RANGE, ElasticParameters.POISSON_RATIO_FIELD),
                Arguments.of(E, 0.7, RHO, FrayMessage.OUT_OF_RANGE, ElasticParameters.POISSON_RATIO_FIELD),
                Arguments.of(E, -1.0, RHO, FrayMessage.OUT_OF_RANGE, ElasticParameters.POISSON_RATIO_FIELD),
                Arguments.of(E, -3.0, RHO, FrayMessage.OUT_OF_RANGE, ElasticParameters.POISSON_RATIO_FIELD),
                Arguments.of(E, Double.NaN, RHO, FrayMessage.NOT_FINITE, ElasticParameters.POISSON_RATIO_FIELD),
                Arguments.of(E, NU, 0.0, FrayMessage.OUT_OF_RANGE, ElasticParameters.DENSITY_FIELD),
                Arguments.of(E, NU, -5.0, FrayMessage.OUT_OF_RANGE, ElasticParameters.DENSITY_FIELD),
                Arguments.of(E, NU, Double.NaN, FrayMessage.NOT_FINITE, ElasticParameters.DENSITY_FIELD));
    }

    @ParameterizedTest(name = "E = {0}, nu = {1}, rho = {2} -> {3} on {4}")
    @MethodSource("badParameters")
    void rejectsBadParametersEverywhere(double e, double nu, double rho, FrayMessage key, String field) {
        List<Runnable> entryPoints = List.of(
                () -> new ElasticParameters(e, nu, rho),
                () -> Elastic.fixedCorotated(e, nu, rho),
                () -> Elastic.neoHookean(e, nu, rho),
                () -> Elastic.henckyStVK(e, nu, rho),
                () -> Elastic.byName("neo-hookean", e, nu, rho));
        for (Runnable entry : entryPoints) {
            InvalidInputException ex = assertThrows(InvalidInputException.class, entry::run);
            assertEquals(key, ex.key());
            Object[] parts = ex.parts();
            assertEquals(field, parts[0], "field name is the first part: " + Arrays.toString(parts));
            assertEquals(key.placeholderCount(), parts.length, "one part per placeholder");
        }
    }

    @Test
    void poissonRangeNamesBothOpenBounds() {
        InvalidInputException ex = assertThrows(InvalidInputException.class,
                () -> new ElasticParameters(E, 0.5, RHO));
        assertEquals(FrayMessage.OUT_OF_RANGE, ex.key());
        assertEquals(0.5, ex.parts()[1]);
        assertEquals("(-1.0, 0.5)", ex.parts()[2]);
    }

    @Test
    void acceptsValuesJustInsideTheOpenPoissonRange() {
        assertNotNull(new ElasticParameters(E, 0.4999, RHO));
        assertNotNull(new ElasticParameters(E, -0.9999, RHO));
    }

    @Test
    void unknownNameListsTheKnownOnes() {
        for (String bad : List.of("steel", "Neo-Hookean", "")) {
            InvalidInputException ex = assertThrows(InvalidInputException.class,
                    () -> Elastic.byName(bad, E, NU, RHO));
            assertEquals(FrayMessage.UNKNOWN_NAME, ex.key());
            assertEquals("material law", ex.parts()[0]);
            assertEquals(bad, ex.parts()[1]);
            for (String known : Elastic.names()) {
                assertTrue(String.valueOf(ex.parts()[2]).contains(known), known);
            }
        }
    }

    @Test
    void nullNameIsMissing() {
        InvalidInputException ex = assertThrows(InvalidInputException.class, () -> Elastic.byName(null, E, NU, RHO));
        assertEquals(FrayMessage.MISSING, ex.key());
    }

    @Test
    void everyKnownNameMakesTheLawOfThatName() {
        assertEquals(List.of("fixed-corotated", "neo-hookean", "stvk-hencky"), Elastic.names());
        for (String name : Elastic.names()) {
            assertEquals(name, Elastic.byName(name, E, NU, RHO).name());
        }
    }
}
