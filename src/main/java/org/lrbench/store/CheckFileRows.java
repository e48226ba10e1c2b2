package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

/**
 * The files of benches' checks, each a link of one store-wide hash chain (table {@code check_file}; its
 * length and head in the one row of {@code check_file_chain}, which a writer takes first). A record
 * altered, removed, inserted or reordered behind lrbench's back breaks the chain; a cut tail shows
 * against an anchor.
 */
final class CheckFileRows {
    /** The name this chain has in an anchor: never a lot number (lot numbers have no '~'). */
    static final String ANCHOR_NAME = "~check-files";
    private static final String COLUMNS = "bench, kind, file, bytes, sha256, recorded_at";

    private final StoreDb store;
    private final LinkChain chain;

    CheckFileRows(StoreDb store) {
        this.store = store;
        this.chain = new LinkChain(store, "check_file_chain", "check files", ANCHOR_NAME);
    }

    void record(CheckFile f) {
        try {
            store.inTransaction(() -> {
                ChainCheck.State st = chain.lock();
                String content = Canonical.sha256(f.content());
                String link = Canonical.chain(st.head(), content);
                try (PreparedStatement p = store.db.prepareStatement("INSERT INTO check_file (seq, " + COLUMNS
                        + ", content_sha256, previous_sha256, record_sha256) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)")) {
                    p.setInt(1, st.length() + 1);
                    p.setString(2, f.bench());
                    p.setString(3, f.kind());
                    p.setString(4, f.file());
                    p.setLong(5, f.bytes());
                    p.setString(6, f.sha256());
                    p.setString(7, f.recordedAt());
                    p.setString(8, content);
                    p.setString(9, st.head());
                    p.setString(10, link);
                    p.executeUpdate();
                }
                chain.advance(st, link);
                return null;
            });
        } catch (SQLException e) {
            throw new StoreException("recording the check file " + f.file() + " failed: " + StoreErrors.describe(e), e);
        }
    }

    private record Row(int seq, CheckFile file, String content, String previous, String link) {
    }

    private List<Row> rows() {
        List<Row> out = new ArrayList<>();
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery("SELECT seq, " + COLUMNS
                + ", content_sha256, previous_sha256, record_sha256 FROM check_file ORDER BY seq")) {
            while (r.next()) {
                out.add(new Row(r.getInt(1), new CheckFile(r.getString(2), r.getString(3), r.getString(4), r.getLong(5),
                        r.getString(6), r.getString(7)), r.getString(8), r.getString(9), r.getString(10)));
            }
        } catch (SQLException e) {
            throw new StoreException("reading the check files' records failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** Every record, in the chain's order. */
    List<CheckFile> all() {
        return rows().stream().map(Row::file).toList();
    }

    /** The chain's breaks: a record altered, removed, inserted or reordered, or a head that is not its last link. */
    List<String> findings() {
        List<LinkChain.Link> links = new ArrayList<>();
        for (Row row : rows()) {
            links.add(new LinkChain.Link(row.seq(), "record " + row.seq() + " (" + row.file().kind() + " "
                    + row.file().file() + ")", Canonical.sha256(row.file().content()), row.content(), row.previous(),
                    row.link()));
        }
        return chain.findings(links);
    }

    ChainAnchor anchor() {
        return chain.anchor();
    }

    /** Whether the record at the anchored length still has the anchored hash (null: it does). */
    String anchorFinding(ChainAnchor a) {
        return chain.anchorFinding(a, "check_file", "seq");
    }
}
