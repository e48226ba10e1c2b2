package org.lrbench.store;

/** One lot's hash chain at a moment: its length and the hash of its last link (what an anchor keeps). */
public record ChainAnchor(String lot, int length, String head) {
}
