package org.lrbench.results;

import com.fasterxml.jackson.databind.ObjectMapper;
import com.fasterxml.jackson.databind.PropertyNamingStrategies;
import com.fasterxml.jackson.databind.SerializationFeature;
import java.io.IOException;
import java.nio.ByteBuffer;
import java.nio.channels.FileChannel;
import java.nio.file.AtomicMoveNotSupportedException;
import java.nio.file.DirectoryStream;
import java.nio.file.FileAlreadyExistsException;
import java.nio.file.FileSystemException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.nio.file.StandardCopyOption;
import java.nio.file.StandardOpenOption;
import java.nio.file.attribute.PosixFilePermissions;
import java.util.ArrayList;
import java.util.List;
import java.util.regex.Matcher;
import java.util.regex.Pattern;

/**
 * Writes files whole or not at all. Content goes to a hidden temporary file in the target's
 * folder, named {@code .NAME.pPID-RANDOM.partial}, written until every byte is out and forced to
 * disk. Records are then published under their final name only if that name is free
 * ({@link #publish}: a hard link, which the file system refuses over an existing file), so a record
 * is never replaced; derived files (reports, summaries, exports) are renamed over the old one
 * ({@link #writeAtomically}). A temporary file left by a process that no longer runs is an orphan
 * and {@link #removeOrphans} deletes it.
 */
public final class ResultFiles {
    public static final ObjectMapper JSON = new ObjectMapper()
            .setPropertyNamingStrategy(PropertyNamingStrategies.SNAKE_CASE)
            .enable(SerializationFeature.INDENT_OUTPUT);
    private static final Pattern TEMPORARY = Pattern.compile("\\..+\\.p(\\d+)-\\d*\\.partial");

    private ResultFiles() {
    }

    /** A derived file (report, summary, export): written whole, then renamed over any older one. */
    public static void writeJson(Path target, Object value) throws IOException {
        writeAtomically(target, JSON.writeValueAsBytes(value));
    }

    /** A derived file (report, summary, export): written whole, then renamed over any older one. */
    public static void writeAtomically(Path target, byte[] content) throws IOException {
        Path tmp = writeTemporary(target, content);
        try {
            try {
                Files.move(tmp, target, StandardCopyOption.ATOMIC_MOVE, StandardCopyOption.REPLACE_EXISTING);
            } catch (AtomicMoveNotSupportedException e) {
                Files.move(tmp, target, StandardCopyOption.REPLACE_EXISTING);
            }
        } catch (IOException e) {
            throw failure("writing", target, e);
        } finally {
            Files.deleteIfExists(tmp);
        }
    }

    /** A record: written whole under a name that must be free; an existing file is never replaced. */
    public static void writeNew(Path target, byte[] content) throws IOException {
        if (Files.exists(target)) {
            throw new FileAlreadyExistsException(target.toString(), null, "a record of that name exists; it is never replaced");
        }
        publish(writeTemporary(target, content), target);
    }

    /**
     * Writes content whole to a new hidden temporary file beside {@code target} and forces it to
     * disk. On any failure (a full disk, say) the temporary file is removed and the error names the
     * target and the system's reason.
     */
    public static Path writeTemporary(Path target, byte[] content) throws IOException {
        Path dir = target.toAbsolutePath().getParent();
        Path tmp;
        try {
            Files.createDirectories(dir);
            tmp = Files.createTempFile(dir, "." + target.getFileName() + ".p" + ProcessHandle.current().pid() + "-",
                    ".partial");
        } catch (IOException e) {
            throw failure("writing", target, e);
        }
        try {
            try {
                // results are records to be read, not secrets: owner writes, everyone reads
                Files.setPosixFilePermissions(tmp, PosixFilePermissions.fromString("rw-r--r--"));
            } catch (UnsupportedOperationException notPosix) {
                // keep the platform's default
            }
            try (FileChannel channel = FileChannel.open(tmp, StandardOpenOption.WRITE)) {
                ByteBuffer buffer = ByteBuffer.wrap(content);
                while (buffer.hasRemaining()) {
                    channel.write(buffer);
                }
                channel.force(true);
            }
            if (Files.size(tmp) != content.length) {
                throw new IOException(tmp + " holds " + Files.size(tmp) + " of " + content.length + " bytes");
            }
            return tmp;
        } catch (IOException | RuntimeException e) {
            Files.deleteIfExists(tmp);
            throw failure("writing", target, e);
        }
    }

    /**
     * Gives a complete temporary file its final name, only if the name is free, and removes the
     * temporary name. Throws {@link FileAlreadyExistsException} (and leaves the temporary file for
     * the caller) when the target exists.
     */
    public static void publish(Path temporary, Path target) throws IOException {
        try {
            Files.createLink(target, temporary);
        } catch (FileAlreadyExistsException e) {
            throw e;
        } catch (UnsupportedOperationException | IOException noLinks) {
            // a file system without hard links: a plain rename that refuses an existing target
            if (Files.exists(target)) {
                throw new FileAlreadyExistsException(target.toString());
            }
            try {
                Files.move(temporary, target);
            } catch (IOException e) {
                throw failure("publishing", target, e);
            }
        }
        Files.deleteIfExists(temporary);
        forceFolder(target.toAbsolutePath().getParent());
    }

    /** Temporary files of {@code target} left in its folder by processes that no longer run. */
    public static List<Path> orphansOf(Path target) throws IOException {
        String prefix = "." + target.getFileName() + ".p";
        List<Path> out = new ArrayList<>();
        for (Path p : orphans(target.toAbsolutePath().getParent())) {
            if (p.getFileName().toString().startsWith(prefix)) {
                out.add(p);
            }
        }
        return out;
    }

    /** Temporary files in {@code dir} whose writing process no longer runs. */
    public static List<Path> orphans(Path dir) throws IOException {
        List<Path> out = new ArrayList<>();
        if (!Files.isDirectory(dir)) {
            return out;
        }
        try (DirectoryStream<Path> files = Files.newDirectoryStream(dir, ".*.partial")) {
            for (Path p : files) {
                Matcher m = TEMPORARY.matcher(p.getFileName().toString());
                if (m.matches() && !alive(m.group(1))) {
                    out.add(p);
                }
            }
        }
        return out;
    }

    /** Deletes the orphaned temporary files in {@code dir}; returns how many. */
    public static int removeOrphans(Path dir) throws IOException {
        int n = 0;
        for (Path p : orphans(dir)) {
            n += Files.deleteIfExists(p) ? 1 : 0;
        }
        return n;
    }

    private static boolean alive(String pid) {
        try {
            long id = Long.parseLong(pid);
            return id == ProcessHandle.current().pid() || ProcessHandle.of(id).map(ProcessHandle::isAlive).orElse(false);
        } catch (NumberFormatException e) {
            return false;
        }
    }

    private static void forceFolder(Path dir) {
        try (FileChannel d = FileChannel.open(dir, StandardOpenOption.READ)) {
            d.force(true);
        } catch (IOException | UnsupportedOperationException notSupported) {
            // some platforms cannot open a folder; the file itself was forced
        }
    }

    private static IOException failure(String doing, Path target, Exception e) {
        String reason = e.getMessage() == null ? e.getClass().getSimpleName() : e.getMessage();
        if (e instanceof FileSystemException f && f.getReason() != null) {
            reason = f.getReason();
        }
        if (reason.contains(target.toString())) {
            return new IOException(doing + " " + reason, e);
        }
        return new IOException(doing + " " + target + ": " + reason, e);
    }
}
