package org.lrbench.yaml;

import java.util.ArrayList;
import java.util.Comparator;
import java.util.List;
import org.yaml.snakeyaml.error.Mark;
import org.yaml.snakeyaml.nodes.Node;

/** Collects the problems of one file so that a user sees every one of them in a single pass. */
public final class Problems {
    private final String file;
    private final List<Problem> list = new ArrayList<>();

    public Problems(String file) {
        this.file = file;
    }

    public String file() {
        return file;
    }

    /** Adds a problem at the start of a node (1-based line and column). */
    public void add(Node at, String key, String message) {
        add(at == null ? null : at.getStartMark(), key, message);
    }

    public void add(Mark mark, String key, String message) {
        int line = mark == null ? 1 : mark.getLine() + 1;
        int column = mark == null ? 1 : mark.getColumn() + 1;
        list.add(new Problem(file, line, column, key, message));
    }

    public boolean isEmpty() {
        return list.isEmpty();
    }

    /** Throws when any problem was recorded. */
    public void throwIfAny() throws ProblemsException {
        if (!list.isEmpty()) {
            List<Problem> sorted = new ArrayList<>(list);
            sorted.sort(Comparator.comparingInt(Problem::line).thenComparingInt(Problem::column));
            throw new ProblemsException(sorted);
        }
    }
}
