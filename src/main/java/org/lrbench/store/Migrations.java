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
                    "ALTER TABLE part_result ADD COLUMN traces_bytes BIGINT"),
            // step 3: inspections with fixed terms, append-only attempts, and the lot's hash chain;
            // the rows of steps 1 and 2 move over as round 1, attempt 1 (they carry no hashes)
            List.of(
                    "CREATE TABLE inspection (lot TEXT NOT NULL, round INTEGER NOT NULL CHECK (round >= 1),"
                            + " part_number TEXT NOT NULL, plan_path TEXT NOT NULL, plan_sha256 TEXT NOT NULL,"
                            + " bench TEXT NOT NULL, lot_size INTEGER CHECK (lot_size >= 1), sample_size INTEGER,"
                            + " sampling TEXT, operator TEXT, reason TEXT, created_at TEXT NOT NULL, disposition TEXT"
                            + " CHECK (disposition IN ('accept', 'reject')), disposition_reason TEXT, finished_at TEXT,"
                            + " PRIMARY KEY (lot, round))",
                    "INSERT INTO inspection (lot, round, part_number, plan_path, plan_sha256, bench, lot_size, sample_size,"
                            + " created_at, disposition, disposition_reason, finished_at) SELECT lot, 1, part_number,"
                            + " plan_path, plan_sha256, bench, lot_size, sample_size, created_at, disposition,"
                            + " disposition_reason, finished_at FROM lot",
                    "CREATE TABLE attempt (lot TEXT NOT NULL, serial TEXT NOT NULL, attempt INTEGER NOT NULL"
                            + " CHECK (attempt >= 1), round INTEGER NOT NULL, position INTEGER NOT NULL, verdict TEXT NOT NULL"
                            + " CHECK (verdict IN ('pass', 'fail', 'error', 'skipped')), inductance_h DOUBLE PRECISION,"
                            + " series_resistance_ohm DOUBLE PRECISION, measured_at TEXT NOT NULL,"
                            + " program_version TEXT NOT NULL, operator TEXT, reason TEXT, result_json TEXT NOT NULL,"
                            + " json_file TEXT, traces_file TEXT, traces_bytes BIGINT, traces_sha256 TEXT,"
                            + " PRIMARY KEY (lot, serial, attempt), FOREIGN KEY (lot, round) REFERENCES inspection (lot, round))",
                    "INSERT INTO attempt (lot, serial, attempt, round, position, verdict, inductance_h,"
                            + " series_resistance_ohm, measured_at, program_version, result_json, json_file, traces_file,"
                            + " traces_bytes) SELECT lot, serial, 1, 1, position, verdict, inductance_h, series_resistance_ohm,"
                            + " measured_at, program_version, result_json, serial || '.json', traces_file, traces_bytes"
                            + " FROM part_result",
                    "CREATE INDEX attempt_by_round ON attempt (lot, round, position)",
                    "CREATE TABLE lot_chain (lot TEXT PRIMARY KEY, length INTEGER NOT NULL, head_sha256 TEXT NOT NULL)",
                    "CREATE TABLE chain_record (lot TEXT NOT NULL, seq INTEGER NOT NULL, kind TEXT NOT NULL"
                            + " CHECK (kind IN ('terms', 'attempt', 'decision')), round INTEGER NOT NULL, serial TEXT,"
                            + " attempt INTEGER, content_sha256 TEXT NOT NULL, previous_sha256 TEXT NOT NULL,"
                            + " record_sha256 TEXT NOT NULL, PRIMARY KEY (lot, seq))",
                    "DROP TABLE part_result",
                    "DROP TABLE lot"),
            // step 4: the switching rules of ISO 2859-1: each inspection's supplier and severity, what
            // its decision means for the rules, and the decisions people record for a supplier's scheme
            List.of(
                    "ALTER TABLE inspection ADD COLUMN supplier TEXT",
                    "ALTER TABLE inspection ADD COLUMN severity TEXT"
                            + " CHECK (severity IN ('normal', 'tightened', 'reduced'))",
                    "ALTER TABLE inspection ADD COLUMN severity_reason TEXT",
                    "ALTER TABLE inspection ADD COLUMN switching_step INTEGER",
                    "ALTER TABLE inspection ADD COLUMN reinstates_normal INTEGER",
                    "CREATE TABLE scheme_decision (part_number TEXT NOT NULL, supplier TEXT NOT NULL,"
                            + " seq INTEGER NOT NULL CHECK (seq >= 1), decided_at TEXT NOT NULL, severity TEXT NOT NULL"
                            + " CHECK (severity IN ('normal', 'tightened', 'reduced', 'discontinued')), reason TEXT NOT NULL,"
                            + " operator TEXT, override INTEGER NOT NULL, PRIMARY KEY (part_number, supplier, seq))"),
            // step 5: each inspection's sampling plans per class as data (n, Ac, Re under its severity)
            List.of(
                    "ALTER TABLE inspection ADD COLUMN class_plans TEXT"),
            // step 6: whether an inspection was measured on the simulated bench: such lots never count
            // toward a real supplier's scheme, history or statistics (earlier lots stay as recorded: real)
            List.of(
                    "ALTER TABLE inspection ADD COLUMN simulated INTEGER NOT NULL DEFAULT 0",
                    "ALTER TABLE scheme_decision ADD COLUMN simulated INTEGER NOT NULL DEFAULT 0"),
            // step 7: parts measured outside a lot's sample (run --serial), each a link of one hash chain
            List.of(
                    "CREATE TABLE single_part_chain (id INTEGER PRIMARY KEY CHECK (id = 1), length INTEGER NOT NULL,"
                            + " head_sha256 TEXT NOT NULL)",
                    "INSERT INTO single_part_chain (id, length, head_sha256) VALUES (1, 0, '" + Canonical.GENESIS + "')",
                    "CREATE TABLE single_part (seq INTEGER PRIMARY KEY CHECK (seq >= 1), lot TEXT NOT NULL,"
                            + " serial TEXT NOT NULL, attempt INTEGER NOT NULL CHECK (attempt >= 1), bench TEXT NOT NULL,"
                            + " result_file TEXT NOT NULL,"
                            + " result_bytes BIGINT NOT NULL, result_sha256 TEXT NOT NULL, traces_file TEXT, traces_bytes BIGINT,"
                            + " traces_sha256 TEXT, simulated INTEGER NOT NULL, recorded_at TEXT NOT NULL,"
                            + " content_sha256 TEXT NOT NULL, previous_sha256 TEXT NOT NULL, record_sha256 TEXT NOT NULL,"
                            + " UNIQUE (lot, serial, attempt))"),
            // step 8: who holds a lot being measured, so that two runs of one lot meet a clear refusal
            List.of(
                    "CREATE TABLE lot_hold (lot TEXT PRIMARY KEY, holder TEXT NOT NULL, bench TEXT NOT NULL,"
                            + " host TEXT NOT NULL, pid BIGINT NOT NULL, since TEXT NOT NULL, renewed_at TEXT NOT NULL)"),
            // step 9: decisions on suppliers' schemes become links of a hash chain of their own (earlier ones
            // stay unlinked and are listed as unverifiable)
            List.of(
                    "ALTER TABLE scheme_decision ADD COLUMN chain_seq INTEGER",
                    "ALTER TABLE scheme_decision ADD COLUMN content_sha256 TEXT",
                    "ALTER TABLE scheme_decision ADD COLUMN previous_sha256 TEXT",
                    "ALTER TABLE scheme_decision ADD COLUMN record_sha256 TEXT",
                    "CREATE TABLE decision_chain (id INTEGER PRIMARY KEY CHECK (id = 1), length INTEGER NOT NULL,"
                            + " head_sha256 TEXT NOT NULL)",
                    "INSERT INTO decision_chain (id, length, head_sha256) VALUES (1, 0, '" + Canonical.GENESIS + "')"),
            // step 10: the files of a bench's checks (check-standard readings, overrides of the gate), each
            // a link of one hash chain, so that a forged in-control reading or a removed override shows
            List.of(
                    "CREATE TABLE check_file_chain (id INTEGER PRIMARY KEY CHECK (id = 1), length INTEGER NOT NULL,"
                            + " head_sha256 TEXT NOT NULL)",
                    "INSERT INTO check_file_chain (id, length, head_sha256) VALUES (1, 0, '" + Canonical.GENESIS + "')",
                    "CREATE TABLE check_file (seq INTEGER PRIMARY KEY CHECK (seq >= 1), bench TEXT NOT NULL,"
                            + " kind TEXT NOT NULL, file TEXT NOT NULL UNIQUE, bytes BIGINT NOT NULL, sha256 TEXT NOT NULL,"
                            + " recorded_at TEXT NOT NULL, content_sha256 TEXT NOT NULL, previous_sha256 TEXT NOT NULL,"
                            + " record_sha256 TEXT NOT NULL)"));
}
