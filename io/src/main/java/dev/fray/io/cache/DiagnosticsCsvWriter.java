package dev.fray.io.cache;

import dev.fray.core.error.Checks;
import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.sim.Diagnostics;
import dev.fray.core.sim.SimulationView;
import dev.fray.core.sim.StepAction;
import dev.fray.core.sim.StepInfo;
import dev.fray.core.sim.StepListener;
import dev.fray.io.AtomicFiles;
import dev.fray.io.result.CrackBand;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;

/**
 * Step listener that records {@link Diagnostics} as CSV: a header of {@link Diagnostics#columns()} (the
 * scene-independent {@link Diagnostics#COLUMNS}, then force and work columns per grip and obstacle; names carry the
 * SI unit) and {@link #CRACK_COLUMNS}, then one row per recorded step. Doubles are written with
 * {@link Double#toString(double)}, which round-trips exactly; the step column is an integer.
 *
 * <p>The crack columns ({@link CrackBand}: volume of partly damaged material, crack area and their ratio, the
 * band width) cost a pass over the particles, so they are filled on rows at frame times (k / frameRate) and left
 * empty on the rows between; a width with no crack surface is written NaN.
 *
 * <p>Rows go to a temporary file next to the target while the run goes on; {@link #finish} (which the run loop
 * calls also after a STOP or a divergence) renames it onto the target, so {@code diagnostics.csv} is either the
 * previous complete file or the new complete one. A later run with the same writer continues the same table.
 *
 * <p>Rows: the state when the first run starts, every {@code everyNSteps}-th step (step count divisible by it),
 * and the last state of each run. Computing diagnostics costs a pass over the particles, hence the option.
 * Not thread-safe: belongs to one simulation.
 */
public final class DiagnosticsCsvWriter implements StepListener {
    /** File name used by {@link #inFolder(Path)}. */
    public static final String FILE_NAME = "diagnostics.csv";
    /** Columns after {@link Diagnostics#COLUMNS}: the crack band of {@link CrackBand}, on frame rows. */
    public static final String[] CRACK_COLUMNS = {"crack_band_volume_m3", "crack_area_m2", "crack_band_width_m"};
    /** Default of everyNSteps: every step. */
    public static final int DEFAULT_EVERY_N_STEPS = 1;

    private final Path target;
    private final int everyNSteps;
    private AtomicFiles.Pending pending;
    private long lastStep = -1;
    private long rows;
    private final CrackBand crackBand = new CrackBand();

    /**
     * @param target      the CSV file to produce; its folder must exist
     * @param everyNSteps record every n-th step, 1 to 1e9
     * @throws InvalidInputException with key OUT_OF_RANGE for a bad everyNSteps, MISSING for a null target
     */
    public DiagnosticsCsvWriter(Path target, int everyNSteps) {
        if (target == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "diagnostics CSV file");
        }
        this.target = target;
        this.everyNSteps = Checks.inRange("everyNSteps", everyNSteps, 1, 1_000_000_000);
    }

    /**
     * @param dir output folder (must exist)
     * @return a writer of {@code dir/diagnostics.csv} recording every step
     */
    public static DiagnosticsCsvWriter inFolder(Path dir) {
        return new DiagnosticsCsvWriter(dir.resolve(FILE_NAME), DEFAULT_EVERY_N_STEPS);
    }

    /** @return the CSV file */
    public Path target() {
        return target;
    }

    /** @return rows written so far, without the header */
    public long rows() {
        return rows;
    }

    /** {@inheritDoc} */
    @Override
    public void init(SimulationView view, double endTime) {
        if (pending == null) {
            pending = AtomicFiles.open(target);
            try {
                if (rows > 0 && Files.exists(target)) {
                    // A later run: carry on from the table the previous run published.
                    Files.copy(target, pending.stream());
                } else {
                    rows = 0;
                    write(String.join(",", view.diagnostics().columns()) + "," + String.join(",", CRACK_COLUMNS)
                            + "\n");
                }
            } catch (IOException e) {
                pending.close();
                pending = null;
                throw new InvalidInputException(FrayMessage.FILE_ERROR, e, target.toString(), e.toString());
            }
        }
        if (view.stepCount() != lastStep) {
            row(view);
        }
    }

    /** {@inheritDoc} */
    @Override
    public StepAction afterStep(StepInfo info) {
        long count = info.step() + 1;
        if (count % everyNSteps == 0) {
            row(info.view());
        }
        return StepAction.CONTINUE;
    }

    /**
     * Records the final state if it is not recorded yet, then publishes the file atomically.
     *
     * @param view the simulation at the end of the run
     * @throws InvalidInputException with key FILE_ERROR if the file cannot be completed
     */
    @Override
    public void finish(SimulationView view) {
        if (pending == null) {
            return;
        }
        AtomicFiles.Pending p = pending;
        pending = null;
        try (p) {
            if (view.stepCount() != lastStep) {
                appendRow(p.stream(), view);
                lastStep = view.stepCount();
            }
            p.commit();
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, target.toString(), e.toString());
        }
    }

    private void row(SimulationView view) {
        if (pending == null) {
            // Driven without init (e.g. a host calling afterStep directly): start the file now.
            init(view, Double.NaN);
            return;
        }
        try {
            appendRow(pending.stream(), view);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, target.toString(), e.toString());
        }
        lastStep = view.stepCount();
    }

    private void appendRow(OutputStream out, SimulationView view) throws IOException {
        Diagnostics d = view.diagnostics();
        double[] v = d.values();
        StringBuilder b = new StringBuilder(16 * v.length);
        b.append(d.step());
        for (int i = 1; i < v.length; i++) {
            b.append(',').append(Double.toString(v[i]));
        }
        if (isFrame(view)) {
            CrackBand.Measure m = crackBand.measure(view);
            b.append(',').append(m.bandVolume()).append(',').append(m.crackArea()).append(',').append(m.width());
        } else {
            b.append(",,,");
        }
        b.append('\n');
        out.write(b.toString().getBytes(StandardCharsets.US_ASCII));
        rows++;
    }

    /** Whether the view is at a frame time k / frameRate, computed as the simulation computes frame times. */
    static boolean isFrame(SimulationView view) {
        double rate = view.scene().frameRate();
        double t = view.time();
        return Math.round(t * rate) / rate == t;
    }

    private void write(String s) throws IOException {
        pending.stream().write(s.getBytes(StandardCharsets.US_ASCII));
    }
}
