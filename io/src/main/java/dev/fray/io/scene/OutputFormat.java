package dev.fray.io.scene;

import java.util.Locale;

/** Kinds of output a run writes, as named in a scene file's {@code output.formats}. */
public enum OutputFormat {
    /** One binary PLY particle file per frame, {@code frame_NNNNN.ply}. */
    PLY,
    /** One VTK XML PolyData file per frame plus a .pvd time series. */
    VTP,
    /** The diagnostics table, {@code diagnostics.csv}. */
    CSV;

    /** @return the name used in scene files: "ply", "vtp" or "csv" */
    public String fileName() {
        return name().toLowerCase(Locale.ROOT);
    }
}
