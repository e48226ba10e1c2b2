package org.lrbench.yaml;

import java.util.List;
import java.util.stream.Collectors;

/** Thrown when an input file has one or more problems; carries all of them, in file order. */
public class ProblemsException extends Exception {
    private static final long serialVersionUID = 1L;

    private final List<Problem> problems;

    public ProblemsException(List<Problem> problems) {
        super(problems.stream().map(Problem::toString).collect(Collectors.joining("\n")));
        this.problems = List.copyOf(problems);
    }

    public List<Problem> problems() {
        return problems;
    }
}
