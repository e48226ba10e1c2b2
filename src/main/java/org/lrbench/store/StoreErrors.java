package org.lrbench.store;

import java.sql.SQLException;
import java.util.Locale;

/** Names the cause of a database failure in words a technician can act on. */
final class StoreErrors {

    private StoreErrors() {
    }

    static String describe(SQLException e) {
        String m = String.valueOf(e.getMessage());
        String state = e.getSQLState() == null ? "" : e.getSQLState();
        String u = m.toUpperCase(Locale.ROOT);
        String cause;
        if (u.contains("SQLITE_FULL") || state.equals("53100") || u.contains("NO SPACE LEFT")) {
            cause = "the disk is full";
        } else if (u.contains("SQLITE_READONLY") || state.equals("25006")) {
            cause = "the store is read-only here";
        } else if (u.contains("SQLITE_BUSY") || u.contains("DATABASE IS LOCKED") || state.equals("55P03")) {
            cause = "another program holds the store locked";
        } else if (u.contains("SQLITE_CORRUPT") || u.contains("SQLITE_NOTADB")) {
            cause = "the store file is corrupt or not an lrbench store";
        } else if (u.contains("SQLITE_CANTOPEN")) {
            cause = "the store file cannot be opened (missing folder or no permission)";
        } else if (u.contains("SQLITE_IOERR")) {
            cause = "the disk reported an input/output error";
        } else {
            return m;
        }
        return cause + " (" + m + ")";
    }
}
