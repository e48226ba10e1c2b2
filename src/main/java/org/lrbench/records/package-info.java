/**
 * A lot's records and their integrity: the one path from a finished part to the store, its result
 * file and its trace archive ({@link org.lrbench.records.StoreLedger}), the repair of files a crash
 * left unpublished, and the verification that names what was altered, truncated or removed.
 */
package org.lrbench.records;
