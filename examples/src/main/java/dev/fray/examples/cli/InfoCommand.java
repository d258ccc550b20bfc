package dev.fray.examples.cli;

import dev.fray.core.error.FrayMessage;
import dev.fray.core.error.InvalidInputException;
import dev.fray.io.checkpoint.CheckpointReader;
import dev.fray.io.scene.LoadedScene;
import dev.fray.io.scene.SceneReader;
import picocli.CommandLine.Command;
import picocli.CommandLine.Mixin;
import picocli.CommandLine.Model.CommandSpec;
import picocli.CommandLine.Parameters;
import picocli.CommandLine.Spec;

import javax.xml.XMLConstants;
import javax.xml.parsers.DocumentBuilderFactory;
import java.io.IOException;
import java.io.InputStream;
import java.io.PrintWriter;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.NoSuchFileException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.concurrent.Callable;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * {@code fray info FILE}: says what a Fray file holds: a PLY or VTP particle frame (particles, channels, time,
 * and whether the file is complete), a .pvd series, a diagnostics CSV, or a checkpoint (time, step, frame,
 * particles, channel table, attachments, the embedded scene; every checksum verified).
 */
@Command(name = "info", mixinStandardHelpOptions = true,
        description = {"Say what a PLY or VTP frame, a .pvd series, a diagnostics CSV or a checkpoint holds."})
public final class InfoCommand implements Callable<Integer> {
    private static final byte[] CHECKPOINT_MAGIC = {(byte) 0x89, 'F', 'R', 'A', 'Y', 'C', 'P', 0x0A};
    private static final int MAX_HEADER = 1 << 20;

    @Spec
    private CommandSpec spec;

    @Mixin
    private DebugOption debug;

    @Parameters(index = "0", paramLabel = "FILE", description = "A .ply, .vtp, .pvd, .csv or .fcp file.")
    private Path file;

    /** Created by picocli. */
    public InfoCommand() {
    }

    /**
     * Inspects the file and prints what it holds.
     *
     * @return the exit code
     */
    @Override
    public Integer call() {
        PrintWriter out = spec.commandLine().getOut();
        byte[] head = head(file, 16);
        String start = new String(head, StandardCharsets.ISO_8859_1);
        if (head.length >= 8 && Arrays.equals(Arrays.copyOf(head, 8), CHECKPOINT_MAGIC)) {
            checkpoint(out);
        } else if (start.startsWith("ply\n") || start.startsWith("ply\r\n")) {
            ply(out);
        } else if (start.startsWith("<?xml") || start.startsWith("<VTKFile")) {
            String text = new String(head(file, 4096), StandardCharsets.ISO_8859_1);
            if (text.contains("type=\"Collection\"")) {
                pvd(out);
            } else if (text.contains("type=\"PolyData\"")) {
                vtp(out);
            } else {
                throw unknown();
            }
        } else if (file.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".csv")) {
            csv(out);
        } else {
            throw unknown();
        }
        out.flush();
        return FrayCommand.OK;
    }

    private InvalidInputException unknown() {
        boolean scene = file.getFileName().toString().toLowerCase(Locale.ROOT).endsWith(".json");
        return new InvalidInputException(FrayMessage.FILE_ERROR, file.toString(), "not a file fray info knows; it "
                + "reads PLY and VTP particle frames, .pvd series, diagnostics CSV files and checkpoints (.fcp)"
                + (scene ? "; for a scene file use fray check" : ""));
    }

    private static byte[] head(Path file, int n) {
        try (InputStream in = Files.newInputStream(file)) {
            return in.readNBytes(n);
        } catch (NoSuchFileException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "no such file");
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "cannot read: " + e);
        }
    }

    private long size() {
        try {
            return Files.size(file);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "cannot read: " + e);
        }
    }

    // ------------------------------------------------------------------ checkpoint

    private void checkpoint(PrintWriter out) {
        CheckpointReader.Info info = CheckpointReader.info(file);
        out.printf(Locale.ROOT, "checkpoint %s: valid, format version %d, %s, every checksum verified%n", file,
                info.version(), CheckCommand.bytes(info.fileBytes()));
        out.printf(Locale.ROOT, "  time %s s, step %d, frame %d, last dt %s s%n", info.time(), info.step(),
                info.frame(), info.dt());
        out.printf(Locale.ROOT, "  particles: %d%n", info.particles());
        out.printf(Locale.ROOT, "  channels (%d):%n", info.channels().size());
        for (CheckpointReader.ChannelEntry c : info.channels()) {
            out.printf(Locale.ROOT, "    %-24s width %d%n", c.name(), c.width());
        }
        if (!info.attachments().isEmpty()) {
            out.printf(Locale.ROOT, "  attachments:%n");
            info.attachments().forEach((k, v) -> out.printf(Locale.ROOT, "    %s (%s)%n", k, CheckCommand.bytes(v)));
        }
        try {
            // Meshes the scene reads are attachments (listed above); here only the body names are wanted, so the
            // scene is read from its text, with meshes from disk where they still are.
            LoadedScene s = new SceneReader().read(info.sceneJson().getBytes(StandardCharsets.UTF_8),
                    file + " (embedded scene)", null);
            List<String> names = new ArrayList<>();
            s.scene().bodies().forEach(b -> names.add(b.name()));
            out.printf(Locale.ROOT, "  scene: %d bodies (%s), %d frames at %.4g frames/s%n", names.size(),
                    String.join(", ", names), s.output().frames(), s.scene().frameRate());
        } catch (InvalidInputException e) {
            String m = e.getMessage();
            out.printf(Locale.ROOT, "  scene: %d characters of scene text (not readable here: %s)%n",
                    info.sceneJson().length(), m.substring(0, Math.min(m.length(), 200)).replace('\n', ' '));
        }
    }

    // ------------------------------------------------------------------ PLY

    private void ply(PrintWriter out) {
        byte[] bytes = head(file, MAX_HEADER);
        String text = new String(bytes, StandardCharsets.ISO_8859_1);
        int end = text.indexOf("end_header\n");
        if (end < 0) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, file.toString(),
                    "PLY header without end_header (truncated or not a particle frame)");
        }
        int headerBytes = end + "end_header\n".length();
        String format = "";
        long vertices = -1;
        boolean inVertex = false;
        int record = 0;
        List<String> props = new ArrayList<>();
        Map<String, String> comments = new LinkedHashMap<>();
        List<String> bodies = new ArrayList<>();
        List<String> other = new ArrayList<>();
        for (String line : text.substring(0, end).split("\n")) {
            String[] w = line.trim().split("\\s+");
            switch (w[0]) {
                case "format" -> format = line.substring(7).trim();
                case "comment" -> {
                    if (w.length >= 4 && w[1].equals("body")) {
                        String[] parts = line.trim().split("\\s+", 4);
                        bodies.add(parts[2] + " " + parts[3]);
                    } else if (w.length >= 3 && (w[1].equals("time_s") || w[1].equals("step") || w[1].equals("frame"))) {
                        comments.put(w[1], w[2]);
                    }
                }
                case "element" -> {
                    inVertex = w.length >= 3 && w[1].equals("vertex");
                    if (inVertex) {
                        vertices = Long.parseLong(w[2]);
                    } else if (w.length >= 3) {
                        other.add(w[1] + " (" + w[2] + ")");
                    }
                }
                case "property" -> {
                    if (inVertex && w.length >= 3) {
                        record += typeBytes(w[1]);
                        props.add(w[2]);
                    }
                }
                default -> {
                }
            }
        }
        long expected = vertices < 0 ? -1 : headerBytes + vertices * record;
        long size = size();
        String state = !format.startsWith("binary") || !other.isEmpty() ? "not a Fray particle frame layout"
                : size == expected ? "complete" : size < expected ? "TRUNCATED (" + (expected - size)
                + " bytes missing)" : "has " + (size - expected) + " unexpected bytes at the end";
        out.printf(Locale.ROOT, "PLY particle frame %s: %s, %s, format %s%n", file, state, CheckCommand.bytes(size),
                format);
        out.printf(Locale.ROOT, "  particles: %d%n", vertices);
        if (!comments.isEmpty()) {
            out.printf(Locale.ROOT, "  time %s s, step %s, frame %s%n", comments.getOrDefault("time_s", "?"),
                    comments.getOrDefault("step", "?"), comments.getOrDefault("frame", "?"));
        }
        if (!bodies.isEmpty()) {
            out.printf(Locale.ROOT, "  bodies: %s%n", String.join(", ", bodies));
        }
        out.printf(Locale.ROOT, "  properties: %s%n", channels(props));
        if (!other.isEmpty()) {
            out.printf(Locale.ROOT, "  other elements: %s%n", String.join(", ", other));
        }
    }

    private static int typeBytes(String t) {
        return switch (t) {
            case "char", "uchar", "int8", "uint8" -> 1;
            case "short", "ushort", "int16", "uint16" -> 2;
            case "int", "uint", "float", "int32", "uint32", "float32" -> 4;
            case "double", "float64" -> 8;
            default -> 0;
        };
    }

    /** Groups NAME_0 .. NAME_k properties into one channel of width k + 1. */
    private static String channels(List<String> props) {
        Map<String, Integer> widths = new LinkedHashMap<>();
        Pattern comp = Pattern.compile("(.+)_(\\d)");
        for (String p : props) {
            Matcher m = comp.matcher(p);
            String name = m.matches() ? m.group(1) : p;
            widths.merge(name, 1, Integer::sum);
        }
        List<String> out = new ArrayList<>();
        widths.forEach((k, v) -> out.add(v == 1 ? k : k + " (" + v + ")"));
        return String.join(", ", out);
    }

    // ------------------------------------------------------------------ VTP

    private static final Pattern ARRAY = Pattern.compile("<DataArray type=\"(\\w+)\" Name=\"([^\"]*)\" "
            + "NumberOfComponents=\"(\\d+)\" format=\"appended\" offset=\"(\\d+)\"/>");
    private static final Pattern POINTS = Pattern.compile("NumberOfPoints=\"(\\d+)\"");
    private static final Pattern TIME = Pattern.compile("time_s ([^,]+), step (\\d+)(?:, frame (\\d+))?");
    private static final String TRAILER = "\n  </AppendedData>\n</VTKFile>\n";

    private void vtp(PrintWriter out) {
        String text = new String(head(file, MAX_HEADER), StandardCharsets.ISO_8859_1);
        int mark = text.indexOf("<AppendedData encoding=\"raw\">");
        int underscore = mark < 0 ? -1 : text.indexOf('_', mark);
        Matcher pm = POINTS.matcher(text);
        if (underscore < 0 || !pm.find()) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, file.toString(),
                    "VTK PolyData without raw appended data: not a Fray particle frame, or truncated");
        }
        long n = Long.parseLong(pm.group(1));
        long data = 0;
        List<String> names = new ArrayList<>();
        Matcher am = ARRAY.matcher(text.substring(0, mark));
        while (am.find()) {
            int comps = Integer.parseInt(am.group(3));
            int size = switch (am.group(1)) {
                case "Float64", "Int64", "UInt64" -> 8;
                case "Float32", "Int32", "UInt32" -> 4;
                default -> 1;
            };
            data += 8 + n * comps * size;
            String name = am.group(2);
            if (!name.equals("connectivity") && !name.equals("offsets")) {
                names.add(comps == 1 ? name : name + " (" + comps + ")");
            }
        }
        long expected = underscore + 1 + data + TRAILER.length();
        long size = size();
        String state = size == expected ? "complete" : size < expected ? "TRUNCATED (" + (expected - size)
                + " bytes missing)" : "has " + (size - expected) + " unexpected bytes";
        out.printf(Locale.ROOT, "VTP particle frame %s: %s, %s%n", file, state, CheckCommand.bytes(size));
        out.printf(Locale.ROOT, "  particles: %d%n", n);
        Matcher tm = TIME.matcher(text);
        if (tm.find()) {
            out.printf(Locale.ROOT, "  time %s s, step %s, frame %s%n", tm.group(1), tm.group(2),
                    tm.group(3) == null ? "?" : tm.group(3));
        }
        out.printf(Locale.ROOT, "  arrays: %s%n", String.join(", ", names));
    }

    // ------------------------------------------------------------------ PVD and CSV

    private void pvd(PrintWriter out) {
        org.w3c.dom.Document doc;
        try {
            DocumentBuilderFactory f = DocumentBuilderFactory.newInstance();
            // A series file never needs a DTD or external entities; refusing them keeps a hostile file harmless.
            f.setFeature("http://apache.org/xml/features/disallow-doctype-decl", true);
            f.setAttribute(XMLConstants.ACCESS_EXTERNAL_DTD, "");
            f.setAttribute(XMLConstants.ACCESS_EXTERNAL_SCHEMA, "");
            var builder = f.newDocumentBuilder();
            builder.setErrorHandler(null);
            doc = builder.parse(file.toFile());
        } catch (Exception e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(),
                    "not a readable .pvd series: " + e.getMessage());
        }
        var sets = doc.getElementsByTagName("DataSet");
        int missing = 0;
        String first = null;
        String last = null;
        Path dir = file.toAbsolutePath().getParent();
        for (int i = 0; i < sets.getLength(); i++) {
            var e = (org.w3c.dom.Element) sets.item(i);
            if (!Files.isRegularFile(dir.resolve(e.getAttribute("file")))) {
                missing++;
            }
            String entry = e.getAttribute("file") + " at " + e.getAttribute("timestep") + " s";
            first = first == null ? entry : first;
            last = entry;
        }
        out.printf(Locale.ROOT, "VTK series %s: %d frames%s%n", file, sets.getLength(),
                missing == 0 ? ", every file present" : ", " + missing + " files missing");
        if (first != null) {
            out.printf(Locale.ROOT, "  first %s, last %s%n", first, last);
        }
    }

    private void csv(PrintWriter out) {
        List<String> lines;
        try {
            lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        } catch (IOException e) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, e, file.toString(), "not a readable CSV table: "
                    + e);
        }
        if (lines.isEmpty()) {
            throw new InvalidInputException(FrayMessage.FILE_ERROR, file.toString(), "empty CSV file");
        }
        String[] header = lines.get(0).split(",");
        out.printf(Locale.ROOT, "CSV table %s: %d rows, %d columns%n", file, lines.size() - 1, header.length);
        out.printf(Locale.ROOT, "  columns: %s%n", String.join(", ", header));
        if (lines.size() > 1) {
            String[] row = lines.get(lines.size() - 1).split(",");
            int time = Arrays.asList(header).indexOf("time_s");
            if (time >= 0 && time < row.length) {
                out.printf(Locale.ROOT, "  last row: step %s, time %s s%n", row[0], row[time]);
            }
        }
    }
}
