package dev.fray.io.mesh;

import dev.fray.core.error.InvalidInputException;

import java.nio.charset.StandardCharsets;

/**
 * Tokenizer over the bytes of a text mesh file (ASCII; other bytes are only allowed inside ignored content). Tracks
 * the line number for messages and parses numbers straight from the bytes: decimal numbers of up to 15
 * significant digits with a power of ten within 10^±22 are computed exactly by one correctly rounded multiply or
 * divide (Clinger's fast path, W. D. Clinger 1990, "How to read floating point numbers accurately"); longer ones
 * go through {@link Double#parseDouble} after the syntax has been checked here.
 */
final class TextCursor {
    private static final double[] POW10 = {1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12,
        1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22};
    /** Longest number token accepted; longer ones are certainly not coordinates. */
    private static final int MAX_NUMBER_LENGTH = 400;

    private final byte[] b;
    private final int end;
    private final String name;
    private final boolean continuations;
    private int pos;
    private int line;
    private int ts;
    private int te;
    private int tokenLine;

    /**
     * @param b             the bytes
     * @param start         first byte to read
     * @param end           end (exclusive)
     * @param name          file name for messages
     * @param firstLine     line number of the byte at start
     * @param continuations whether a backslash before a line end joins the lines (OBJ)
     */
    TextCursor(byte[] b, int start, int end, String name, int firstLine, boolean continuations) {
        this.b = b;
        this.pos = start;
        this.end = end;
        this.name = name;
        this.line = firstLine;
        this.tokenLine = firstLine;
        this.continuations = continuations;
    }

    /** @return the current line number (1-based) */
    int line() {
        return line;
    }

    /** @return whether every byte has been read */
    boolean atEnd() {
        return pos >= end;
    }

    private static boolean blank(int c) {
        return c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == 0x0b;
    }

    private void skipBlanks() {
        while (pos < end) {
            int c = b[pos];
            if (blank(c)) {
                pos++;
            } else if (continuations && c == '\\' && continuationAt(pos)) {
                pos++;
                while (b[pos] != '\n') {
                    pos++;
                }
                pos++;
                line++;
            } else {
                return;
            }
        }
    }

    /** A backslash followed only by blanks up to a line end. */
    private boolean continuationAt(int p) {
        int i = p + 1;
        while (i < end && blank(b[i])) {
            i++;
        }
        return i < end && b[i] == '\n';
    }

    /** @return whether only blanks remain on the current line */
    boolean atLineEnd() {
        skipBlanks();
        return pos >= end || b[pos] == '\n';
    }

    /** Moves to the start of the next line, ignoring the rest of this one. */
    void skipLine() {
        while (pos < end && b[pos] != '\n') {
            pos++;
        }
        if (pos < end) {
            pos++;
            line++;
        }
    }

    /**
     * Reads the next token on the current line.
     *
     * @return false (reading nothing) if the line has no more tokens
     */
    boolean lineToken() {
        if (atLineEnd()) {
            return false;
        }
        ts = pos;
        tokenLine = line;
        while (pos < end && !blank(b[pos]) && b[pos] != '\n') {
            pos++;
        }
        te = pos;
        return true;
    }

    /**
     * Reads the next token, on this line or a later one.
     *
     * @return false at the end of the input
     */
    boolean anyToken() {
        while (true) {
            skipBlanks();
            if (pos >= end) {
                return false;
            }
            if (b[pos] == '\n') {
                pos++;
                line++;
                continue;
            }
            return lineToken();
        }
    }

    /**
     * @param what what was expected, for the message
     * @throws InvalidInputException if the line has no more tokens
     */
    void requireLineToken(String what) {
        if (!lineToken()) {
            throw error("expected " + what + " but the line ends");
        }
    }

    /**
     * @param what what was expected, for the message
     * @throws InvalidInputException at the end of the input
     */
    void requireAnyToken(String what) {
        if (!anyToken()) {
            throw error("expected " + what + " but the file ends");
        }
    }

    /**
     * @param word ASCII word
     * @return whether the current token is that word exactly
     */
    boolean is(String word) {
        if (te - ts != word.length()) {
            return false;
        }
        for (int i = 0; i < word.length(); i++) {
            if (b[ts + i] != word.charAt(i)) {
                return false;
            }
        }
        return true;
    }

    /**
     * @param word ASCII word, lower case
     * @return whether the current token is that word in any letter case
     */
    boolean isIgnoreCase(String word) {
        if (te - ts != word.length()) {
            return false;
        }
        for (int i = 0; i < word.length(); i++) {
            int c = b[ts + i];
            if (c >= 'A' && c <= 'Z') {
                c += 'a' - 'A';
            }
            if (c != word.charAt(i)) {
                return false;
            }
        }
        return true;
    }

    /** @return the current token quoted for a message */
    String quoted() {
        return MeshBytes.quote(b, ts, te);
    }

    /** @return the current token as text (ASCII, other bytes replaced) */
    String text() {
        return new String(b, ts, te - ts, StandardCharsets.US_ASCII);
    }

    /** @return the rest of the current line, trimmed, as text; the cursor stays on the line end */
    String restOfLine() {
        skipBlanks();
        int s = pos;
        while (pos < end && b[pos] != '\n') {
            pos++;
        }
        int e = pos;
        while (e > s && blank(b[e - 1])) {
            e--;
        }
        return new String(b, s, e - s, StandardCharsets.US_ASCII);
    }

    /**
     * @param reason what is wrong and what is allowed
     * @return the error, naming the file and the line of the current token
     */
    InvalidInputException error(String reason) {
        return MeshBytes.error(name, "line " + tokenLine, reason);
    }

    /**
     * Parses the current token as a decimal number. The words nan, inf and infinity (any case, with a sign)
     * give NaN and infinities, for the caller to report.
     *
     * @param what what the number is, for the message
     * @return the value
     * @throws InvalidInputException if the token is not a number
     */
    double number(String what) {
        int i = ts;
        boolean neg = false;
        if (i < te && (b[i] == '+' || b[i] == '-')) {
            neg = b[i] == '-';
            i++;
        }
        if (i < te && (b[i] | 0x20) >= 'a' && (b[i] | 0x20) <= 'z') {
            return special(i, neg, what);
        }
        if (te - ts > MAX_NUMBER_LENGTH) {
            throw error(what + " has more than " + MAX_NUMBER_LENGTH + " characters");
        }
        long mant = 0;
        int sig = 0;
        int exp = 0;
        boolean digits = false;
        while (i < te && b[i] >= '0' && b[i] <= '9') {
            digits = true;
            if (sig < 18) {
                mant = mant * 10 + (b[i] - '0');
                if (mant != 0) {
                    sig++;
                }
            } else {
                sig++;
                exp++;
            }
            i++;
        }
        if (i < te && b[i] == '.') {
            i++;
            while (i < te && b[i] >= '0' && b[i] <= '9') {
                digits = true;
                if (sig < 18) {
                    mant = mant * 10 + (b[i] - '0');
                    if (mant != 0) {
                        sig++;
                    }
                    exp--;
                } else {
                    sig++;
                }
                i++;
            }
        }
        if (!digits) {
            throw notNumber(what);
        }
        if (i < te && (b[i] == 'e' || b[i] == 'E')) {
            i++;
            boolean eneg = false;
            if (i < te && (b[i] == '+' || b[i] == '-')) {
                eneg = b[i] == '-';
                i++;
            }
            if (i >= te || b[i] < '0' || b[i] > '9') {
                throw notNumber(what);
            }
            int e = 0;
            while (i < te && b[i] >= '0' && b[i] <= '9') {
                if (e < 100_000) {
                    e = e * 10 + (b[i] - '0');
                }
                i++;
            }
            exp += eneg ? -e : e;
        }
        if (i != te) {
            throw notNumber(what);
        }
        double v;
        if (mant == 0) {
            v = 0.0;
        } else if (sig <= 15 && exp >= -22 && exp <= 22) {
            v = exp >= 0 ? mant * POW10[exp] : mant / POW10[-exp];
        } else {
            // The syntax is checked above, so the JDK parser accepts the token.
            v = Double.parseDouble(new String(b, ts, te - ts, StandardCharsets.US_ASCII));
            return v;
        }
        return neg ? -v : v;
    }

    private double special(int i, boolean neg, String what) {
        int len = te - i;
        if (len == 3 && lower(i, "nan")) {
            return Double.NaN;
        }
        if ((len == 3 && lower(i, "inf")) || (len == 8 && lower(i, "infinity"))) {
            return neg ? Double.NEGATIVE_INFINITY : Double.POSITIVE_INFINITY;
        }
        throw notNumber(what);
    }

    private boolean lower(int i, String word) {
        for (int k = 0; k < word.length(); k++) {
            if ((b[i + k] | 0x20) != word.charAt(k)) {
                return false;
            }
        }
        return true;
    }

    /**
     * @param what what the number is
     * @return the current token as a finite number
     * @throws InvalidInputException if it is not a number or not finite
     */
    double finiteNumber(String what) {
        double v = number(what);
        if (!Double.isFinite(v)) {
            throw error(what + " must be a finite number, got " + quoted());
        }
        return v;
    }

    /**
     * Parses the current token as a decimal integer, optionally signed.
     *
     * @param what what the number is, for the message
     * @return the value
     * @throws InvalidInputException if the token is not an integer of at most 18 digits
     */
    long integer(String what) {
        int i = ts;
        boolean neg = false;
        if (i < te && (b[i] == '+' || b[i] == '-')) {
            neg = b[i] == '-';
            i++;
        }
        if (i >= te) {
            throw notInteger(what);
        }
        long v = 0;
        int n = 0;
        while (i < te && b[i] >= '0' && b[i] <= '9') {
            v = v * 10 + (b[i] - '0');
            if (++n > 18) {
                throw error(what + " " + quoted() + " is too large");
            }
            i++;
        }
        if (i != te) {
            throw notInteger(what);
        }
        return neg ? -v : v;
    }

    /**
     * Parses the leading integer of the current token, up to the first '/' (OBJ face corners "v/vt/vn").
     *
     * @param what what the number is
     * @return the value
     * @throws InvalidInputException if the part before '/' is not an integer of at most 18 digits
     */
    long leadingInteger(String what) {
        int i = ts;
        if (i < te && (b[i] == '+' || b[i] == '-')) {
            i++;
        }
        int stop = i;
        while (stop < te && b[stop] != '/') {
            stop++;
        }
        int saved = te;
        te = stop;
        try {
            return integer(what);
        } finally {
            te = saved;
        }
    }

    private InvalidInputException notNumber(String what) {
        return error("expected a number for " + what + ", got " + quoted());
    }

    private InvalidInputException notInteger(String what) {
        return error("expected an integer for " + what + ", got " + quoted());
    }
}
