package org.lrbench.cli;

import java.util.concurrent.Callable;
import picocli.AutoComplete;
import picocli.CommandLine;
import picocli.CommandLine.Command;
import picocli.CommandLine.Spec;

/** {@code lrbench completion}: a bash (and zsh) completion script for every command and option. */
@Command(name = "completion", mixinStandardHelpOptions = true,
        description = {"Print a completion script for bash and zsh.", "Use: source <(./lrbench completion)"})
final class CompletionCommand implements Callable<Integer> {

    @Spec
    CommandLine.Model.CommandSpec spec;

    @Override
    public Integer call() {
        // picocli generates it from the command tree itself, so it never falls behind the options
        System.out.print(AutoComplete.bash("lrbench", spec.root().commandLine()));
        return ExitCodes.PASS;
    }
}
