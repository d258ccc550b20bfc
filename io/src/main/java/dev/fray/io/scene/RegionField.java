package dev.fray.io.scene;

import dev.fray.core.boundary.Shape;
import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.particles.ChannelField;

import java.util.ArrayList;
import java.util.List;

/**
 * Initial values of a scalar channel set region by region: a particle whose initial position lies inside a
 * region's shape (signed distance &lt;= 0, the test that fills bodies and selects grips) takes that region's value;
 * where regions overlap the last one wins, and a particle outside every region keeps the channel's declared
 * initial value. Scene files hold it as a body's {@code initialValues} entries, one per region, for example a
 * pre-cut sheet of broken particles ({@code "channel": "damage", "value": 1}). Immutable and thread-safe.
 *
 * @param regions the regions in the order they are applied, at least one (copied)
 */
public record RegionField(List<Region> regions) implements ChannelField {
    /**
     * One region and the value it sets.
     *
     * @param shape the region, any shape (bounded or not)
     * @param value the value inside it, finite, in the channel's SI unit
     */
    public record Region(Shape shape, double value) {
        /** Checks the fields. */
        public Region {
            Checks.notNull("region shape", shape);
            Checks.finite("region value", value);
        }
    }

    /** Checks and copies the regions. */
    public RegionField {
        Checks.notNull("regions", regions);
        if (regions.isEmpty()) {
            throw new InvalidInputException(FrayMessage.MISSING, "regions of an initial-value field");
        }
        for (Region r : regions) {
            Checks.notNull("region", r);
        }
        regions = List.copyOf(regions);
    }

    /**
     * @param shape the region
     * @param value the value inside it, finite, in the channel's SI unit
     * @return a field of one region
     */
    public static RegionField of(Shape shape, double value) {
        return new RegionField(List.of(new Region(shape, value)));
    }

    /**
     * @param shape a further region, applied after the others
     * @param value the value inside it, finite
     * @return a new field with the region added (this one is not changed)
     */
    public RegionField then(Shape shape, double value) {
        List<Region> r = new ArrayList<>(regions);
        r.add(new Region(shape, value));
        return new RegionField(r);
    }

    /** {@inheritDoc} Writes out[0] only, and only inside a region. */
    @Override
    public void value(double x, double y, double z, double[] out) {
        for (Region r : regions) {
            if (r.shape().distance(x, y, z) <= 0) {
                out[0] = r.value();
            }
        }
    }
}
