package org.lrbench.store;

import java.util.List;

/**
 * The store's schema as an explicit list of versioned steps. A store records the version it is at
 * in {@code schema_version}; opening it applies the missing steps in order, each in one transaction.
 * Steps are only ever appended.
 */
final class Migrations {

    private Migrations() {
    }

    static final List<List<String>> STEPS = List.of(
            List.of(
                    "CREATE TABLE lot (lot TEXT PRIMARY KEY, part_number TEXT NOT NULL, plan_path TEXT NOT NULL,"
                            + " plan_sha256 TEXT NOT NULL, bench TEXT NOT NULL, lot_size INTEGER CHECK (lot_size >= 1),"
                            + " sample_size INTEGER, created_at TEXT NOT NULL, disposition TEXT"
                            + " CHECK (disposition IN ('accept', 'reject')), disposition_reason TEXT, finished_at TEXT)",
                    "CREATE TABLE part_result (lot TEXT NOT NULL REFERENCES lot (lot), serial TEXT NOT NULL,"
                            + " position INTEGER NOT NULL, verdict TEXT NOT NULL"
                            + " CHECK (verdict IN ('pass', 'fail', 'error', 'skipped')), inductance_h DOUBLE PRECISION,"
                            + " series_resistance_ohm DOUBLE PRECISION, measured_at TEXT NOT NULL, program_version TEXT NOT NULL,"
                            + " result_json TEXT NOT NULL, PRIMARY KEY (lot, serial))",
                    "CREATE INDEX part_result_by_lot ON part_result (lot, position)"),
            List.of(
                    "ALTER TABLE part_result ADD COLUMN traces_file TEXT",
                    "ALTER TABLE part_result ADD COLUMN traces_bytes BIGINT"));
}
