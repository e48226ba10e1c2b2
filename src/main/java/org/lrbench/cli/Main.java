package org.lrbench.cli;

import java.io.IOException;
import org.lrbench.calibration.CalibrationRefused;
import org.lrbench.instrument.InstrumentException;
import org.lrbench.run.FixtureChange;
import org.lrbench.measure.LevelRefused;
import org.lrbench.lot.LotRefused;
import org.lrbench.store.StoreException;
import org.lrbench.transport.AddressException;
import org.lrbench.yaml.ProblemsException;
import picocli.CommandLine.Command;
import picocli.CommandLine;

/** The {@code lrbench} command line. */
@Command(name = "lrbench", mixinStandardHelpOptions = true, versionProvider = Main.Version.class,
        description = "Inductor incoming inspection on a signal generator and digitizer bench.",
        subcommands = {DemoCommand.class, CheckCommand.class, RunCommand.class, CalibrateCommand.class, StoreCommands.Lots.class,
                StoreCommands.Lot.class, StoreCommands.History.class, VerifyCommand.class, AnchorCommand.class, DriversCommand.class, ExerciseCommand.class, ReportCommand.class, ServeCommand.class, RehearseCommand.class, StudyCommand.class, StandardCommand.class, SchemeCommand.class, AnalyzeCommand.class, SimCommand.class,
                BenchmarkCommand.class, CompletionCommand.class, picocli.CommandLine.HelpCommand.class})
public final class Main implements Runnable {

    public static void main(String[] args) {
        System.exit(execute(args));
    }

    /** Runs a command line and returns its exit code (tests call this). */
    public static int execute(String... args) {
        CommandLine cli = new CommandLine(new Main());
        // picocli already exits with 2 (ExitCode.USAGE) on invalid options, matching BAD_INPUT
        cli.setExecutionExceptionHandler((e, commandLine, parsed) -> {
            if (e instanceof ProblemsException p) {
                ResultText.problems(commandLine.getErr(), p.problems());
                return ExitCodes.BAD_INPUT;
            }
            if (e instanceof LotRefused held && held.kind() == LotRefused.Kind.HELD) {
                commandLine.getErr().println("lrbench: " + e.getMessage());
                return ExitCodes.LOT_HELD;
            }
            if (e instanceof BadInputException || e instanceof LotRefused
                    || e instanceof AddressException) {
                commandLine.getErr().println("lrbench: " + e.getMessage());
                return ExitCodes.BAD_INPUT;
            }
            if (e instanceof StoreException) {
                commandLine.getErr().println("lrbench: results store: " + e.getMessage());
                return ExitCodes.BAD_INPUT;
            }
            if (e instanceof FixtureChange.OperatorGone) {
                commandLine.getErr().println("lrbench: " + e.getMessage());
                return ExitCodes.LOT_OPEN;
            }
            if (e instanceof CalibrationRefused) {
                commandLine.getErr().println("lrbench: calibration: " + e.getMessage());
                return ExitCodes.INSTRUMENT;
            }
            if (e instanceof InstrumentException || e instanceof LevelRefused) {
                commandLine.getErr().println("lrbench: instrument error: " + e.getMessage());
                return ExitCodes.INSTRUMENT;
            }
            if (e instanceof IOException) {
                commandLine.getErr().println("lrbench: file error: " + e.getMessage());
                return ExitCodes.BAD_INPUT;
            }
            // a bug, not a verdict: never let it look like a pass (0) or a fail (1)
            commandLine.getErr().println("lrbench: internal error, please report it:");
            e.printStackTrace(commandLine.getErr());
            return ExitCodes.INTERNAL;
        });
        return cli.execute(args);
    }

    @Override
    public void run() {
        new CommandLine(this).usage(System.out);
    }

    /** Reports the program version from the jar manifest. */
    static final class Version implements CommandLine.IVersionProvider {
        @Override
        public String[] getVersion() {
            return new String[] {"lrbench " + Home.version()};
        }
    }
}
