package dev.fray.core.grid;

import static org.junit.jupiter.api.Assertions.assertEquals;
import static org.junit.jupiter.api.Assertions.assertSame;
import static org.junit.jupiter.api.Assertions.assertThrows;
import static org.junit.jupiter.api.Assertions.assertTrue;

import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;

import java.util.Arrays;

/** Velocity fields per node: zeroing by block range, growth with the grid, field 0 living in the grid. */
class FieldSetTest extends FrayTestBase {
    private static final int NPB = SparseGrid.NODES_PER_BLOCK;

    /** zero(from, to) clears exactly blocks [from, to) of every field, mass and momentum, and nothing else. */
    @Test
    void zeroClearsOnlyTheGivenBlocksOfEveryField() {
        SparseGrid grid = gridWithBlocks(3);
        FieldSet fields = new FieldSet(grid, 3);
        fields.ensureNodes();
        assertSame(grid.mass(), fields.mass(0), "field 0 is the grid's own storage");
        assertSame(grid.momentum(), fields.momentum(0));
        for (int f = 0; f < 3; f++) {
            Arrays.fill(fields.mass(f), 7.0);
            Arrays.fill(fields.momentum(f), 7.0);
        }
        fields.zero(1, 2);
        for (int f = 0; f < 3; f++) {
            for (int node = 0; node < 3 * NPB; node++) {
                double expected = node >= NPB && node < 2 * NPB ? 0.0 : 7.0;
                assertEquals(expected, fields.mass(f)[node], "mass of field " + f + " at node " + node);
                for (int k = 0; k < 3; k++) {
                    assertEquals(expected, fields.momentum(f)[3 * node + k], "momentum of field " + f);
                }
            }
        }
    }

    /** The extra fields grow with the grid's active nodes and keep their storage when the grid shrinks. */
    @Test
    void extraFieldsGrowWithTheGrid() {
        SparseGrid grid = gridWithBlocks(2);
        FieldSet fields = new FieldSet(grid, 2);
        assertEquals(2, fields.count());
        fields.ensureNodes();
        assertTrue(fields.mass(1).length >= 2 * NPB);
        assertTrue(fields.momentum(1).length >= 3 * 2 * NPB);
        for (int b = 2; b < 40; b++) {
            grid.activate(SparseGrid.key(b, -b, 2 * b));
        }
        grid.allocateNodes();
        fields.ensureNodes();
        double[] grown = fields.mass(1);
        assertTrue(grown.length >= 40 * NPB, "mass grew to the grid's " + 40 * NPB + " nodes");
        assertTrue(fields.momentum(1).length >= 3 * 40 * NPB, "momentum grew");
        assertEquals(8L * (grown.length + fields.momentum(1).length), fields.extraBytes());
        grid.clear();
        grid.activate(SparseGrid.key(0, 0, 0));
        grid.allocateNodes();
        fields.ensureNodes();
        assertSame(grown, fields.mass(1), "no reallocation when the grid shrinks");
    }

    /** A field set needs at least one field. */
    @Test
    void rejectsNoFields() {
        assertThrows(IllegalArgumentException.class, () -> new FieldSet(new SparseGrid(), 0));
    }

    private static SparseGrid gridWithBlocks(int n) {
        SparseGrid grid = new SparseGrid();
        for (int b = 0; b < n; b++) {
            assertEquals(b, grid.activate(SparseGrid.key(b, 0, -1)));
        }
        grid.allocateNodes();
        return grid;
    }
}
