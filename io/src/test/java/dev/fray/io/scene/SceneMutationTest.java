package dev.fray.io.scene;

import com.fasterxml.jackson.databind.JsonNode;
import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.node.ArrayNode;
import com.fasterxml.jackson.databind.node.JsonNodeFactory;
import com.fasterxml.jackson.databind.node.ObjectNode;
import dev.fray.core.error.InvalidInputException;
import dev.fray.core.plugin.PluginRegistry;
import dev.fray.core.testing.FrayTestBase;
import org.junit.jupiter.api.Test;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.time.Duration;
import java.util.ArrayList;
import java.util.Iterator;
import java.util.List;
import java.util.Random;
import java.util.stream.Stream;

import static org.junit.jupiter.api.Assertions.assertFalse;
import static org.junit.jupiter.api.Assertions.assertTimeoutPreemptively;
import static org.junit.jupiter.api.Assertions.assertTrue;
import static org.junit.jupiter.api.Assertions.fail;

/**
 * Seeded mutations of valid scene files (truncation, wrong types, NaN, huge numbers, deleted keys, binary garbage,
 * deep nesting) either read or fail with a clean {@link InvalidInputException}, never another exception and never
 * a hang.
 */
class SceneMutationTest extends FrayTestBase {
    private static final SceneReader READER = new SceneReader(PluginRegistry.load());
    private static final ObjectMapper JSON = new ObjectMapper();
    private static final int MUTATIONS_PER_FILE = 200;

    /** A valid scene text and the folder its file names resolve against. */
    record Source(String text, Path base) {
    }

    static List<Source> validScenes() throws IOException {
        List<Source> out = new ArrayList<>();
        out.add(new Source(SceneErrorsTest.valid(), null));
        out.add(new Source(SceneWriter.toJson(SceneRoundTripTest.everything()), null));
        Path shipped = Path.of("..", "examples", "scenes").toAbsolutePath().normalize();
        if (Files.isDirectory(shipped)) {
            try (Stream<Path> s = Files.list(shipped)) {
                for (Path p : s.filter(p -> p.toString().endsWith(".json")).sorted().toList()) {
                    out.add(new Source(Files.readString(p), shipped));
                }
            }
        }
        return out;
    }

    @Test
    void mutatedScenesFailCleanly() throws IOException {
        List<Source> scenes = validScenes();
        int rejected = 0;
        int total = 0;
        for (int f = 0; f < scenes.size(); f++) {
            String text = scenes.get(f).text();
            Path base = scenes.get(f).base();
            READER.read(text.getBytes(StandardCharsets.UTF_8), "valid.json", base);
            Random r = new Random(SEED + f);
            for (int i = 0; i < MUTATIONS_PER_FILE; i++) {
                int kind = i % 8;
                byte[] mutated = mutate(text, kind, r);
                total++;
                String label = "file " + f + ", mutation " + i + " (kind " + kind + ")";
                rejected += readsOrFailsCleanly(mutated, base, label) ? 0 : 1;
            }
        }
        assertTrue(rejected > total / 2, "most mutations break the file: " + rejected + " of " + total);
    }

    @Test
    void hostileShapesOfInputFailFast() {
        List<byte[]> inputs = new ArrayList<>();
        inputs.add("[".repeat(100_000).getBytes(StandardCharsets.US_ASCII));
        inputs.add(("{\"a\":".repeat(10_000)).getBytes(StandardCharsets.US_ASCII));
        inputs.add(("{\"format\": \"" + "x".repeat(1 << 20) + "\"}").getBytes(StandardCharsets.US_ASCII));
        inputs.add(("{\"run\": {\"cellSize\": 1" + "0".repeat(10_000) + "}}").getBytes(StandardCharsets.US_ASCII));
        inputs.add(new byte[0]);
        inputs.add(new byte[] {(byte) 0xff, (byte) 0xfe, 0, 0});
        inputs.add(new byte[] {0, 0, (byte) 0xfe, (byte) 0xff, 0, 0, 0, '{'});
        byte[] big = new byte[SceneReader.MAX_FILE_BYTES + 1];
        java.util.Arrays.fill(big, (byte) ' ');
        inputs.add(big);
        String manyBodies = "{\"bodies\": [" + "{},".repeat(20_000) + "{}]}";
        inputs.add(manyBodies.getBytes(StandardCharsets.US_ASCII));
        for (int i = 0; i < inputs.size(); i++) {
            assertFalse(readsOrFailsCleanly(inputs.get(i), null, "hostile input " + i), "hostile input " + i + " read");
        }
    }

    /** @return true if the input read as a scene, false if it was rejected cleanly */
    static boolean readsOrFailsCleanly(byte[] input, Path base, String label) {
        return assertTimeoutPreemptively(Duration.ofSeconds(10), () -> {
            try {
                READER.read(input, "mutated.json", base);
                return true;
            } catch (SceneFileException e) {
                assertFalse(e.problems().isEmpty(), label);
                for (SceneProblem p : e.problems()) {
                    assertTrue(p.file().equals("mutated.json") && !p.message().isBlank(), label + ": " + p);
                }
                return false;
            } catch (InvalidInputException e) {
                return false;
            } catch (RuntimeException | StackOverflowError e) {
                fail(label + " threw " + e, e);
                return false;
            }
        }, label);
    }

    static byte[] mutate(String text, int kind, Random r) throws IOException {
        byte[] b = text.getBytes(StandardCharsets.UTF_8);
        switch (kind) {
            case 0: // truncate
                return java.util.Arrays.copyOf(b, r.nextInt(b.length));
            case 1: { // binary garbage over a stretch
                byte[] out = b.clone();
                int at = r.nextInt(out.length);
                for (int k = 0; k < 1 + r.nextInt(16) && at + k < out.length; k++) {
                    out[at + k] = (byte) r.nextInt(256);
                }
                return out;
            }
            case 2:
                return tree(text, r, "type");
            case 3:
                return tree(text, r, "number");
            case 4:
                return tree(text, r, "delete");
            case 5:
                return tree(text, r, "nanText");
            case 6: { // a single character changed
                byte[] out = b.clone();
                out[r.nextInt(out.length)] = (byte) " {}[],:\"0123456789.eE-+tfn"
                        .charAt(r.nextInt(26));
                return out;
            }
            default: { // random bytes altogether
                byte[] out = new byte[1 + r.nextInt(256)];
                r.nextBytes(out);
                return out;
            }
        }
    }

    /** Structural mutations on the parsed tree: wrong type, odd number, deleted key, NaN literal. */
    private static byte[] tree(String text, Random r, String how) throws IOException {
        JsonNode root = JSON.readTree(text);
        List<JsonNode> containers = new ArrayList<>();
        collect(root, containers);
        JsonNode c = containers.get(r.nextInt(containers.size()));
        JsonNodeFactory f = JsonNodeFactory.instance;
        JsonNode[] odd = {f.textNode("x"), f.booleanNode(true), f.nullNode(), f.arrayNode(), f.objectNode(),
            f.numberNode(1e308), f.numberNode(-1e308), f.numberNode(Double.MIN_VALUE), f.numberNode(0),
            f.numberNode(-1), f.numberNode(new java.math.BigInteger("123456789012345678901234567890")),
            f.numberNode(Long.MAX_VALUE), f.numberNode(Integer.MIN_VALUE)};
        if (c instanceof ObjectNode o && o.size() > 0) {
            List<String> keys = new ArrayList<>();
            o.fieldNames().forEachRemaining(keys::add);
            String key = keys.get(r.nextInt(keys.size()));
            switch (how) {
                case "delete" -> o.remove(key);
                case "nanText" -> o.put(key, "@NAN@");
                default -> o.set(key, odd[r.nextInt(odd.length)]);
            }
        } else if (c instanceof ArrayNode a && a.size() > 0) {
            int i = r.nextInt(a.size());
            switch (how) {
                case "delete" -> a.remove(i);
                case "nanText" -> a.set(i, f.textNode("@NAN@"));
                default -> a.set(i, odd[r.nextInt(odd.length)]);
            }
        }
        String out = JSON.writeValueAsString(root);
        // NaN and Infinity are not JSON; put the bare words in to see the parser reject them.
        String[] words = {"NaN", "Infinity", "-Infinity", "1e999", "-1e999", "1e-999"};
        return out.replace("\"@NAN@\"", words[r.nextInt(words.length)]).getBytes(StandardCharsets.UTF_8);
    }

    private static void collect(JsonNode n, List<JsonNode> out) {
        if (n.isContainerNode()) {
            out.add(n);
            for (Iterator<JsonNode> it = n.elements(); it.hasNext(); ) {
                collect(it.next(), out);
            }
        }
    }
}
