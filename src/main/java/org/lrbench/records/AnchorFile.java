package org.lrbench.records;

import java.io.IOException;
import java.nio.charset.StandardCharsets;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardOpenOption;
import java.time.Instant;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.lrbench.store.Canonical;
import org.lrbench.store.ChainAnchor;

/**
 * An anchor: every lot's chain length and head at one moment, in a text file a lab keeps outside the
 * store, closed by the SHA-256 of everything above it. The last line (the one to copy into the bench log,
 * a signed-off sheet or a message) ties the file to that moment: with it, {@code verify --anchor} proves
 * the store still holds at least every link it had then. Written once, never replaced.
 * <pre>
 * lrbench chain anchor
 * taken: 2026-12-03T21:40:00Z
 * lot	LOT-1	5	3f9a...
 * sha256: 9c1e...
 * </pre>
 */
public final class AnchorFile {
    static final String TITLE = "lrbench chain anchor";
    private static final Pattern LOT = Pattern.compile("lot\\t(\\S+)\\t([1-9][0-9]{0,8})\\t([0-9a-f]{64})");
    private static final Pattern TAKEN = Pattern.compile("taken: (\\S+)");
    private static final Pattern SUM = Pattern.compile("sha256: ([0-9a-f]{64})");

    /** What an anchor file holds: when it was taken, its lots, and its closing line. */
    public record Anchor(String taken, List<ChainAnchor> lots, String sha256Line) {
    }

    private AnchorFile() {
    }

    /** Writes the anchor (refused when the file exists: an anchor is never replaced); returns its closing line. */
    public static String write(Path file, List<ChainAnchor> lots, Instant taken) throws IOException {
        StringBuilder body = new StringBuilder(TITLE).append('\n').append("taken: ").append(taken).append('\n');
        for (ChainAnchor a : lots) {
            body.append("lot\t").append(a.lot()).append('\t').append(a.length()).append('\t').append(a.head()).append('\n');
        }
        String closing = "sha256: " + Canonical.sha256(body.toString());
        Path dir = file.toAbsolutePath().getParent();
        if (dir != null) {
            Files.createDirectories(dir);
        }
        try {
            Files.writeString(file, body + closing + "\n", StandardCharsets.UTF_8, StandardOpenOption.CREATE_NEW,
                    StandardOpenOption.WRITE, StandardOpenOption.SYNC);
        } catch (FileAlreadyExistsException e) {
            throw new IOException(file + " exists: an anchor is never replaced; name a new file", e);
        }
        return closing;
    }

    /**
     * Reads an anchor file; every line that is not the format's is refused with its line number, and a
     * file whose closing line does not match what is above it is refused as edited.
     */
    public static Anchor read(Path file) throws IOException {
        List<String> lines = Files.readAllLines(file, StandardCharsets.UTF_8);
        if (lines.isEmpty() || !lines.get(0).equals(TITLE)) {
            throw new IOException(file + ":1: not an anchor file (its first line is not '" + TITLE + "')");
        }
        StringBuilder body = new StringBuilder(TITLE).append('\n');
        String taken = null;
        List<ChainAnchor> lots = new ArrayList<>();
        for (int i = 1; i < lines.size(); i++) {
            String line = lines.get(i);
            Matcher sum = SUM.matcher(line);
            if (sum.matches()) {
                if (i != lines.size() - 1) {
                    throw new IOException(file + ":" + (i + 2) + ": lines after the sha256 line");
                }
                if (taken == null) {
                    throw new IOException(file + ": no 'taken:' line");
                }
                if (!sum.group(1).equals(Canonical.sha256(body.toString()))) {
                    throw new IOException(file + ":" + (i + 1) + ": the sha256 line does not match the lines above it:"
                            + " the file was edited after it was taken");
                }
                return new Anchor(taken, List.copyOf(lots), line);
            }
            Matcher t = TAKEN.matcher(line);
            Matcher lot = LOT.matcher(line);
            if (t.matches() && taken == null && i == 1) {
                taken = t.group(1);
            } else if (lot.matches() && taken != null) {
                lots.add(new ChainAnchor(lot.group(1), Integer.parseInt(lot.group(2)), lot.group(3)));
            } else {
                throw new IOException(file + ":" + (i + 1) + ": '" + printable(line) + "' is not a line of an anchor"
                        + " file (allowed: 'taken: TIME' as the second line, then 'lot<TAB>LOT<TAB>LINKS<TAB>SHA-256',"
                        + " then 'sha256: HEX' last)");
            }
            body.append(line).append('\n');
        }
        throw new IOException(file + ": no closing 'sha256:' line (the file was cut short)");
    }

    private static String printable(String s) {
        String t = s.length() > 80 ? s.substring(0, 80) + "..." : s;
        return t.replaceAll("[^\\x20-\\x7e]", "?");
    }
}
