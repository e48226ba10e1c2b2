package org.lrbench.cli;

import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import java.util.concurrent.Callable;
import org.lrbench.driver.DriverFile;
import org.lrbench.driver.DriverLoader;
import org.lrbench.yaml.ProblemsException;
import picocli.CommandLine.Command;
import picocli.CommandLine.Option;

/** {@code lrbench drivers}: the installed driver files with their kind and description, and any problems. */
@Command(name = "drivers", mixinStandardHelpOptions = true, description = {"List the driver files with their kind and description, and their problems.",
        "Exit 0 when every driver file is sound, 2 otherwise."})
final class DriversCommand implements Callable<Integer> {

    @picocli.CommandLine.Mixin
    FolderOptions.Drivers drivers;

    @Override
    public Integer call() throws Exception {
        Path dir = drivers.folder();
        if (!Files.isDirectory(dir)) {
            throw new BadInputException("no drivers folder at " + dir);
        }
        List<Path> files;
        try (var list = Files.list(dir)) {
            files = list.filter(f -> f.getFileName().toString().endsWith(".yaml")).sorted().toList();
        }
        DriverLoader loader = new DriverLoader(dir);
        boolean sound = true;
        for (Path f : files) {
            String name = f.getFileName().toString().replaceFirst("\\.yaml$", "");
            try {
                DriverFile d = loader.load(name, null);
                System.out.printf("%-24s %-10s %s%n", name, d.kind().key(), d.description());
            } catch (ProblemsException e) {
                sound = false;
                System.out.printf("%-24s %-10s %d problem(s):%n", name, "?", e.problems().size());
                e.problems().forEach(p -> System.out.println("  " + p));
            }
        }
        return sound ? ExitCodes.PASS : ExitCodes.BAD_INPUT;
    }
}
