package org.lrbench.store;

import java.sql.PreparedStatement;
import java.sql.ResultSet;
import java.sql.SQLException;
import java.sql.Statement;
import java.util.ArrayList;
import java.util.List;

/**
 * Parts measured outside a lot's sample, each a link of one store-wide hash chain (table
 * {@code single_part}; its length and head in the one row of {@code single_part_chain}, which a writer
 * takes first, so that two benches take turns). A record altered, removed, inserted or reordered
 * behind lrbench's back breaks the chain; a cut tail shows against an anchor.
 */
final class SinglePartRows {
    /** The name the single parts' chain has in an anchor: never a lot number (lot numbers have no '~'). */
    static final String ANCHOR_NAME = "~single-parts";
    private static final String COLUMNS = "lot, serial, attempt, bench, result_file, result_bytes, result_sha256, traces_file,"
            + " traces_bytes, traces_sha256, simulated, recorded_at";

    private final StoreDb store;
    private final LinkChain chain;

    SinglePartRows(StoreDb store) {
        this.store = store;
        this.chain = new LinkChain(store, "single_part_chain", "single parts", ANCHOR_NAME);
    }

    void record(SingleRecord r) {
        try {
            store.inTransaction(() -> {
                ChainCheck.State st = chain.lock();
                String content = Canonical.sha256(r.content());
                String link = Canonical.chain(st.head(), content);
                try (PreparedStatement p = store.db.prepareStatement("INSERT INTO single_part (seq, " + COLUMNS
                        + ", content_sha256, previous_sha256, record_sha256) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?,"
                        + " ?, ?, ?, ?)")) {
                    p.setInt(1, st.length() + 1);
                    p.setString(2, r.lot());
                    p.setString(3, r.serial());
                    p.setInt(4, r.attempt());
                    p.setString(5, r.bench());
                    p.setString(6, r.resultFile());
                    p.setLong(7, r.resultBytes());
                    p.setString(8, r.resultSha256());
                    p.setString(9, r.tracesFile());
                    p.setObject(10, r.tracesBytes());
                    p.setString(11, r.tracesSha256());
                    p.setInt(12, r.simulated() ? 1 : 0);
                    p.setString(13, r.recordedAt());
                    p.setString(14, content);
                    p.setString(15, st.head());
                    p.setString(16, link);
                    p.executeUpdate();
                }
                chain.advance(st, link);
                return null;
            });
        } catch (SQLException e) {
            throw new StoreException("recording " + r.serial() + " (attempt " + r.attempt() + ") of lot " + r.lot()
                    + " failed: " + StoreErrors.describe(e), e);
        }
    }

    /** Every record, in the chain's order. */
    List<SingleRecord> all() {
        List<SingleRecord> out = new ArrayList<>();
        for (Row row : rows()) {
            out.add(row.record());
        }
        return out;
    }

    private record Row(int seq, SingleRecord record, String content, String previous, String link) {
    }

    private List<Row> rows() {
        List<Row> out = new ArrayList<>();
        try (Statement s = store.db.createStatement(); ResultSet r = s.executeQuery("SELECT seq, " + COLUMNS
                + ", content_sha256, previous_sha256, record_sha256 FROM single_part ORDER BY seq")) {
            while (r.next()) {
                long traces = r.getLong(10);
                Long tracesBytes = r.wasNull() ? null : traces;
                SingleRecord rec = new SingleRecord(r.getString(2), r.getString(3), r.getInt(4), r.getString(5),
                        r.getString(6), r.getLong(7), r.getString(8), r.getString(9), tracesBytes, r.getString(11),
                        r.getInt(12) != 0, r.getString(13));
                out.add(new Row(r.getInt(1), rec, r.getString(14), r.getString(15), r.getString(16)));
            }
        } catch (SQLException e) {
            throw new StoreException("reading the single parts' records failed: " + StoreErrors.describe(e), e);
        }
        return out;
    }

    /** The chain's breaks: a record altered, removed, inserted or reordered, or a head that is not its last link. */
    List<String> findings() {
        List<LinkChain.Link> links = new ArrayList<>();
        for (Row row : rows()) {
            links.add(new LinkChain.Link(row.seq(), "record " + row.seq() + " (" + row.record().serial() + ", attempt "
                    + row.record().attempt() + " in lot " + row.record().lot() + ")",
                    Canonical.sha256(row.record().content()), row.content(), row.previous(), row.link()));
        }
        return chain.findings(links);
    }

    ChainAnchor anchor() {
        return chain.anchor();
    }

    /** Whether the record at the anchored length still has the anchored hash (null: it does). */
    String anchorFinding(ChainAnchor a) {
        return chain.anchorFinding(a, "single_part", "seq");
    }
}
