package dev.fray.io.cache;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.io.AtomicFiles;

import java.io.IOException;
import java.io.OutputStream;
import java.nio.charset.StandardCharsets;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.Map;
import java.util.TreeMap;

/**
 * A time series of data files as a VTK collection file (.pvd: {@code VTKFile type="Collection"} with one
 * {@code DataSet timestep="t" part="0" file="..."} per frame, t in s), rewritten whole and atomically by
 * {@link #write()}, so a reader always sees a complete list of exactly the frames added so far. Entries are kept
 * in frame order; adding a frame index again replaces its entry (a rerun of that frame).
 *
 * <p>Not thread-safe: one writer per collection.
 */
public final class PvdCollection {
    private final Path file;
    private final TreeMap<Integer, Entry> entries = new TreeMap<>();

    /**
     * One data file of the series.
     *
     * @param frame frame index
     * @param time  simulated time, s
     * @param file  data file, relative to the collection file's folder
     */
    public record Entry(int frame, double time, String file) {
    }

    /**
     * @param file the .pvd file to write; its folder must exist when {@link #write()} is called
     * @throws InvalidInputException MISSING for null
     */
    public PvdCollection(Path file) {
        if (file == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "PVD collection file");
        }
        this.file = file;
    }

    /** @return the .pvd file */
    public Path file() {
        return file;
    }

    /**
     * Adds or replaces the entry of a frame (in memory; call {@link #write()} to publish it).
     *
     * @param frame    frame index, &gt;= 0
     * @param time     simulated time, s, finite
     * @param dataFile data file relative to the collection's folder, e.g. "frame_00003.vtp"
     * @throws InvalidInputException OUT_OF_RANGE for a negative frame, NOT_FINITE for a bad time, MISSING for null
     */
    public void put(int frame, double time, String dataFile) {
        if (frame < 0) {
            throw new InvalidInputException(FrayMessage.OUT_OF_RANGE, "PVD frame index", frame, ">= 0");
        }
        if (!Double.isFinite(time)) {
            throw new InvalidInputException(FrayMessage.NOT_FINITE, "PVD frame time (s)", time);
        }
        if (dataFile == null) {
            throw new InvalidInputException(FrayMessage.MISSING, "PVD data file name");
        }
        entries.put(frame, new Entry(frame, time, dataFile));
    }

    /** @return the entries in frame order (a copy) */
    public List<Entry> entries() {
        return List.copyOf(new ArrayList<>(entries.values()));
    }

    /**
     * Writes the collection file atomically (temporary file, then rename).
     *
     * @throws InvalidInputException FILE_ERROR if it cannot be written
     */
    public void write() {
        AtomicFiles.write(file, this::write);
    }

    /**
     * @param out destination (not closed)
     * @throws IOException if the stream fails
     */
    public void write(OutputStream out) throws IOException {
        StringBuilder s = new StringBuilder(128 + 80 * entries.size());
        s.append("<?xml version=\"1.0\"?>\n");
        s.append("<VTKFile type=\"Collection\" version=\"0.1\" byte_order=\"LittleEndian\">\n");
        s.append("  <Collection>\n");
        for (Map.Entry<Integer, Entry> e : entries.entrySet()) {
            s.append("    <DataSet timestep=\"").append(Double.toString(e.getValue().time()))
                    .append("\" part=\"0\" file=\"").append(escape(e.getValue().file())).append("\"/>\n");
        }
        s.append("  </Collection>\n");
        s.append("</VTKFile>\n");
        out.write(s.toString().getBytes(StandardCharsets.UTF_8));
        out.flush();
    }

    /** XML attribute escaping; control characters (not allowed in XML 1.0) become '?'. */
    private static String escape(String s) {
        StringBuilder b = new StringBuilder(s.length() + 8);
        for (int i = 0; i < s.length(); i++) {
            char c = s.charAt(i);
            switch (c) {
                case '&' -> b.append("&amp;");
                case '<' -> b.append("&lt;");
                case '>' -> b.append("&gt;");
                case '"' -> b.append("&quot;");
                case '\'' -> b.append("&apos;");
                default -> b.append(c < 0x20 ? '?' : c);
            }
        }
        return b.toString();
    }
}
