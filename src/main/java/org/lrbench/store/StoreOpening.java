package org.lrbench.store;

import java.io.IOException;
import java.nio.file.Files;
import java.nio.file.Path;
import java.sql.Connection;
import java.sql.DriverManager;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import org.sqlite.SQLiteConfig;
import org.sqlite.SQLiteOpenMode;

/**
 * Opening a store: an SQLite file (created when missing, opened read-only where it may not be
 * written, immutable on read-only media) or a PostgreSQL URL; each brought up to date before use.
 */
final class StoreOpening {

    private StoreOpening() {
    }

    /**
     * Opens (creating if needed) an SQLite store file and brings its schema up to date. A file this
     * process may not write is opened read-only: it can be read if its schema is current.
     */
    static StoreDb open(Path file) {
        boolean readOnly = Files.exists(file) && !Files.isWritable(file);
        return open(file, readOnly);
    }

    /** Opens an existing SQLite store for reading only: nothing is migrated or written. */
    static StoreDb openForReading(Path file) {
        if (!Files.isRegularFile(file)) {
            throw new StoreException("no results store at " + file, null);
        }
        return open(file, true);
    }

    private static StoreDb open(Path file, boolean readOnly) {
        Connection c;
        try {
            if (!readOnly) {
                Files.createDirectories(file.toAbsolutePath().getParent());
            }
            SQLiteConfig cfg = new SQLiteConfig();
            cfg.enforceForeignKeys(true);
            cfg.setBusyTimeout(10_000);
            if (readOnly) {
                cfg.setReadOnly(true);
            } else {
                cfg.setJournalMode(SQLiteConfig.JournalMode.WAL);
                // a transaction takes the write lock when it begins: two writers then wait for each
                // other instead of failing when a read would have to turn into a write
                cfg.setTransactionMode(SQLiteConfig.TransactionMode.IMMEDIATE);
            }
            c = readOnly ? connectForReading(file, cfg) : connectWithRetry("jdbc:sqlite:" + file, cfg);
        } catch (SQLException e) {
            throw new StoreException("cannot open the results store " + file + ": " + StoreErrors.describe(e), e);
        } catch (IOException e) {
            throw new StoreException("cannot open the results store " + file + ": " + e.getMessage(), e);
        }
        return prepared(c, file.toString(), false, readOnly);
    }

    /** An open connection as a store with its schema brought up to date; closed again when that fails. */
    private static StoreDb prepared(Connection c, String where, boolean postgres, boolean readOnly) {
        try {
            StoreDb store = new StoreDb(c, where, postgres, readOnly);
            StoreSchema.of(store).prepare();
            return store;
        } catch (StoreException e) {
            StoreDb.closeQuietly(c);
            throw e;
        } catch (SQLException e) {
            StoreDb.closeQuietly(c);
            throw new StoreException("cannot open the results store " + where + ": " + StoreErrors.describe(e), e);
        }
    }

    /**
     * A store on read-only media (a copy handed to an auditor, a mounted backup): SQLite's shared
     * memory file cannot be made there, so the file is opened as immutable, unless a write-ahead
     * log beside it still holds records not yet in the file, which would then go unread.
     */
    private static Connection connectForReading(Path file, SQLiteConfig cfg) throws SQLException {
        Connection plain = null;
        try {
            plain = connectWithRetry("jdbc:sqlite:" + file, cfg);
            try (Statement s = plain.createStatement(); ResultSet r = s.executeQuery("SELECT COUNT(*) FROM sqlite_master")) {
                r.next();
            }
            return plain;
        } catch (SQLException e) {
            StoreDb.closeQuietly(plain);
            if (!String.valueOf(e.getMessage()).contains("SQLITE_CANTOPEN")) {
                throw e;
            }
            Path wal = Path.of(file + "-wal");
            try {
                if (Files.exists(wal) && Files.size(wal) > 0) {
                    throw new StoreException("the results store " + file + " cannot be read here: its folder is read-only"
                            + " and " + wal.getFileName() + " holds records not yet folded into the file; copy the store"
                            + " with its -wal and -shm files to a writable folder and read it there", e);
                }
            } catch (IOException io) {
                throw new StoreException("cannot read " + wal + ": " + io.getMessage(), io);
            }
            cfg.setOpenMode(SQLiteOpenMode.OPEN_URI);
            return DriverManager.getConnection("jdbc:sqlite:file:" + file.toAbsolutePath() + "?immutable=1",
                    cfg.toProperties());
        }
    }

    /** Setting WAL mode on a new file needs a lock for a moment; a bench opening it at the same time waits. */
    private static Connection connectWithRetry(String url, SQLiteConfig cfg) throws SQLException {
        for (int attempt = 1; ; attempt++) {
            try {
                return DriverManager.getConnection(url, cfg.toProperties());
            } catch (SQLException e) {
                if (attempt >= 50 || !String.valueOf(e.getMessage()).contains("SQLITE_BUSY")) {
                    throw e;
                }
                try {
                    Thread.sleep(20L * attempt);
                } catch (InterruptedException i) {
                    Thread.currentThread().interrupt();
                    throw e;
                }
            }
        }
    }

    /**
     * Opens a store by JDBC URL: {@code jdbc:postgresql://HOST:PORT/DB?user=...} for a shared
     * PostgreSQL store, or {@code jdbc:sqlite:FILE}.
     */
    static StoreDb openUrl(String url) {
        if (url.startsWith("jdbc:sqlite:")) {
            return open(Path.of(url.substring("jdbc:sqlite:".length())));
        }
        if (!url.startsWith("jdbc:postgresql:")) {
            throw new StoreException("store URL '" + url + "': use jdbc:postgresql://... or jdbc:sqlite:FILE", null);
        }
        String shown = url.replaceAll("password=[^&]*", "password=***");
        Connection c;
        try {
            c = DriverManager.getConnection(url);
        } catch (SQLException e) {
            throw new StoreException("cannot open the results store " + shown + ": " + StoreErrors.describe(e), e);
        }
        return prepared(c, shown, true, false);
    }
}
