package dev.fray.examples.cli;

import dev.fray.core.sim.FrameListener;
import dev.fray.core.sim.SimulationView;

import java.io.PrintWriter;
import java.util.Locale;
import org.slf4j.Logger;
import org.slf4j.LoggerFactory;

/**
 * Reports run progress at every frame: frame, simulated time, current time step, steps per second and the
 * estimated wall time left. On a terminal it rewrites one line in place (carriage return); otherwise it logs one
 * plain line per frame through SLF4J.
 */
final class ProgressReporter implements FrameListener {
    private static final Logger LOG = LoggerFactory.getLogger(ProgressReporter.class);

    private final PrintWriter terminal;
    private final String label;
    private final int frames;
    private long startNanos = -1;
    private long startSteps;
    private int firstFrame;
    private int lastWidth;

    private ProgressReporter(PrintWriter terminal, String label, int frames) {
        this.terminal = terminal;
        this.label = label;
        this.frames = frames;
    }

    /**
     * @param err    where the terminal line goes
     * @param label  name shown at the start of each line
     * @param frames frames the run will produce after the current one
     * @return a reporter writing to err if a console is attached, else one logging lines
     */
    static ProgressReporter forConsole(PrintWriter err, String label, int frames) {
        return new ProgressReporter(System.console() != null ? err : null, label, frames);
    }

    /**
     * Starts the clock now, for a run that starts at a frame other than 0 (a resumed run, whose first event is
     * the frame after the checkpoint). Without it, the clock starts at the first frame event.
     *
     * @param view  the simulation about to run
     * @param frame the frame it is at
     */
    void begin(SimulationView view, int frame) {
        startNanos = System.nanoTime();
        startSteps = view.stepCount();
        firstFrame = frame;
    }

    /** {@inheritDoc} */
    @Override
    public void onFrame(int frame, double time, SimulationView view, boolean isLast) {
        long now = System.nanoTime();
        if (startNanos < 0) {
            startNanos = now;
            startSteps = view.stepCount();
            firstFrame = frame;
        }
        double elapsed = (now - startNanos) * 1e-9;
        int done = frame - firstFrame;
        long steps = view.stepCount() - startSteps;
        double stepsPerSecond = elapsed > 0 ? steps / elapsed : 0;
        int left = Math.max(0, frames - done);
        String eta = done > 0 ? clock(elapsed / done * left) : "--:--";
        String line = String.format(Locale.ROOT, "%s frame %d/%d  t = %.4f s  dt = %.3e s  %.0f steps/s  left %s",
                label, frame, firstFrame + frames, time, view.dt(), stepsPerSecond, eta);
        if (terminal == null) {
            LOG.info(line);
            return;
        }
        int pad = Math.max(0, lastWidth - line.length());
        terminal.print("\r" + line + " ".repeat(pad));
        lastWidth = line.length();
        if (isLast) {
            terminal.println();
            lastWidth = 0;
        }
        terminal.flush();
    }

    /** {@inheritDoc} */
    @Override
    public void finish(SimulationView view) {
        if (terminal != null && lastWidth > 0) {
            // End the in-place line even when the run stopped before its last frame.
            terminal.println();
            terminal.flush();
            lastWidth = 0;
        }
    }

    private static String clock(double seconds) {
        long s = Math.round(seconds);
        return s >= 3600 ? String.format(Locale.ROOT, "%d:%02d:%02d", s / 3600, s / 60 % 60, s % 60)
                : String.format(Locale.ROOT, "%d:%02d", s / 60, s % 60);
    }
}
