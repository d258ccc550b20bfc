package dev.fray.io.scene;

import com.fasterxml.jackson.core.JsonFactory;
import com.fasterxml.jackson.core.JsonLocation;
import com.fasterxml.jackson.core.JsonParseException;
import com.fasterxml.jackson.core.JsonParser;
import com.fasterxml.jackson.core.JsonProcessingException;
import com.fasterxml.jackson.core.JsonToken;
import com.fasterxml.jackson.core.StreamReadConstraints;
import com.fasterxml.jackson.core.StreamReadFeature;

import java.io.IOException;
import java.util.ArrayList;
import java.util.Collections;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * A parsed JSON document whose every value remembers its line and column, so that errors found while interpreting
 * it can point into the file. Jackson's own tree forgets locations, hence this small one. Strict JSON only: no
 * comments, no NaN, no trailing content; duplicate keys are reported. Bounded: nesting depth, string and number
 * lengths are capped so that hostile input costs little.
 */
final class JsonTree {
    /** Deepest nesting accepted; real scene files need fewer than ten levels. */
    static final int MAX_DEPTH = 64;
    /** Longest string value accepted, in characters. */
    static final int MAX_STRING = 1 << 16;
    /** Longest number literal accepted, in characters. */
    static final int MAX_NUMBER = 64;

    private static final JsonFactory FACTORY = JsonFactory.builder()
            .streamReadConstraints(StreamReadConstraints.builder()
                    .maxNestingDepth(MAX_DEPTH)
                    .maxStringLength(MAX_STRING)
                    .maxNumberLength(MAX_NUMBER)
                    .maxNameLength(MAX_STRING)
                    .build())
            // Duplicates are found here, with their path; the source text must not leak into messages.
            .disable(StreamReadFeature.STRICT_DUPLICATE_DETECTION)
            .disable(StreamReadFeature.INCLUDE_SOURCE_IN_LOCATION)
            .build();

    private JsonTree() {
    }

    /** Any JSON value with the place where it starts (1-based line and column; 0 where unknown). */
    abstract static class Node {
        final int line;
        final int column;

        Node(int line, int column) {
            this.line = line;
            this.column = column;
        }

        /** @return the kind of value in words, for messages ("an object", "a number", ...) */
        abstract String kind();
    }

    /** A JSON object: members in file order, with the location of each key. */
    static final class Obj extends Node {
        final Map<String, Node> members;
        final Map<String, int[]> keyAt;

        Obj(int line, int column, Map<String, Node> members, Map<String, int[]> keyAt) {
            super(line, column);
            this.members = Collections.unmodifiableMap(members);
            this.keyAt = Collections.unmodifiableMap(keyAt);
        }

        @Override
        String kind() {
            return "an object";
        }
    }

    /** A JSON array. */
    static final class Arr extends Node {
        final List<Node> items;

        Arr(int line, int column, List<Node> items) {
            super(line, column);
            this.items = Collections.unmodifiableList(items);
        }

        @Override
        String kind() {
            return "a list";
        }
    }

    /** A JSON string. */
    static final class Str extends Node {
        final String value;

        Str(int line, int column, String value) {
            super(line, column);
            this.value = value;
        }

        @Override
        String kind() {
            return "a string";
        }
    }

    /**
     * A JSON number: its double value (possibly infinite when the literal is too large) and, for literals without
     * fraction or exponent that fit, its exact long value.
     */
    static final class Num extends Node {
        final double value;
        final boolean integral;
        final long longValue;
        final String text;

        Num(int line, int column, double value, boolean integral, long longValue, String text) {
            super(line, column);
            this.value = value;
            this.integral = integral;
            this.longValue = longValue;
            this.text = text;
        }

        @Override
        String kind() {
            return "a number";
        }
    }

    /** true or false. */
    static final class Bool extends Node {
        final boolean value;

        Bool(int line, int column, boolean value) {
            super(line, column);
            this.value = value;
        }

        @Override
        String kind() {
            return "true/false";
        }
    }

    /** null. */
    static final class Null extends Node {
        Null(int line, int column) {
            super(line, column);
        }

        @Override
        String kind() {
            return "null";
        }
    }

    /** The document is not JSON at all; parsing stopped at the given place. */
    static final class SyntaxError extends Exception {
        private static final long serialVersionUID = 1L;
        final int line;
        final int column;

        SyntaxError(String message, int line, int column) {
            super(message);
            this.line = line;
            this.column = column;
        }
    }

    /** Receives duplicate keys, which are not fatal: the later value wins and parsing goes on. */
    @FunctionalInterface
    interface DuplicateSink {
        void duplicate(String path, String key, int line, int column);
    }

    /**
     * Parses a whole document.
     *
     * @param bytes      the file content (UTF-8, or UTF-16/32 with detection)
     * @param duplicates told about every repeated key
     * @return the root value
     * @throws SyntaxError if the bytes are not one well-formed JSON value
     */
    static Node parse(byte[] bytes, DuplicateSink duplicates) throws SyntaxError {
        try (JsonParser p = FACTORY.createParser(bytes)) {
            JsonToken t = p.nextToken();
            if (t == null) {
                throw new SyntaxError("the file is empty; a scene file holds one JSON object", 1, 1);
            }
            Node root = value(p, t, "", duplicates);
            JsonToken extra;
            try {
                extra = p.nextToken();
            } catch (JsonProcessingException e) {
                throw syntax(e, p);
            }
            if (extra != null) {
                JsonLocation at = p.currentTokenLocation();
                throw new SyntaxError("unexpected content after the end of the top-level value", at.getLineNr(),
                        at.getColumnNr());
            }
            return root;
        } catch (JsonProcessingException e) {
            throw syntax(e, null);
        } catch (IOException e) {
            // Only decoding failures reach here (the input is in memory), e.g. malformed UTF-32.
            throw new SyntaxError("not readable as JSON text: " + e.getMessage(), 0, 0);
        }
    }

    private static SyntaxError syntax(JsonProcessingException e, JsonParser p) {
        JsonLocation at = e.getLocation() != null ? e.getLocation() : p == null ? null : p.currentLocation();
        String msg = e.getOriginalMessage();
        msg = msg == null ? e.getClass().getSimpleName() : msg.replace('\n', ' ').replace('\r', ' ');
        if (msg.length() > 200) {
            msg = msg.substring(0, 200) + "...";
        }
        return new SyntaxError("not valid JSON: " + msg, at == null ? 0 : Math.max(0, at.getLineNr()),
                at == null ? 0 : Math.max(0, at.getColumnNr()));
    }

    private static Node value(JsonParser p, JsonToken t, String path, DuplicateSink duplicates) throws IOException {
        JsonLocation at = p.currentTokenLocation();
        int line = at.getLineNr();
        int col = at.getColumnNr();
        switch (t) {
            case START_OBJECT: {
                Map<String, Node> members = new LinkedHashMap<>();
                Map<String, int[]> keyAt = new LinkedHashMap<>();
                for (JsonToken k = p.nextToken(); k != JsonToken.END_OBJECT; k = p.nextToken()) {
                    String key = p.currentName();
                    JsonLocation kl = p.currentTokenLocation();
                    JsonToken v = p.nextToken();
                    Node child = value(p, v, JsonPaths.member(path, key), duplicates);
                    if (members.containsKey(key)) {
                        duplicates.duplicate(path, key, kl.getLineNr(), kl.getColumnNr());
                    }
                    members.put(key, child);
                    keyAt.put(key, new int[] {kl.getLineNr(), kl.getColumnNr()});
                }
                return new Obj(line, col, members, keyAt);
            }
            case START_ARRAY: {
                List<Node> items = new ArrayList<>();
                for (JsonToken v = p.nextToken(); v != JsonToken.END_ARRAY; v = p.nextToken()) {
                    items.add(value(p, v, JsonPaths.index(path, items.size()), duplicates));
                }
                return new Arr(line, col, items);
            }
            case VALUE_STRING:
                return new Str(line, col, p.getText());
            case VALUE_NUMBER_INT: {
                String text = p.getText();
                JsonParser.NumberType nt = p.getNumberType();
                if (nt == JsonParser.NumberType.INT || nt == JsonParser.NumberType.LONG) {
                    long v = p.getLongValue();
                    return new Num(line, col, v, true, v, text);
                }
                // Too large for a long: keep it as a double, which may be infinite and is then rejected.
                return new Num(line, col, Double.parseDouble(text), false, 0, text);
            }
            case VALUE_NUMBER_FLOAT: {
                String text = p.getText();
                return new Num(line, col, Double.parseDouble(text), false, 0, text);
            }
            case VALUE_TRUE:
                return new Bool(line, col, true);
            case VALUE_FALSE:
                return new Bool(line, col, false);
            case VALUE_NULL:
                return new Null(line, col);
            default:
                throw new JsonParseException(p, "unexpected token " + t);
        }
    }
}
