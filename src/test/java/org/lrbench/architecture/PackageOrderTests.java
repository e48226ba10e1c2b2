package org.lrbench.architecture;

import static org.assertj.core.api.Assertions.assertThat;

import com.tngtech.archunit.core.domain.Dependency;
import com.tngtech.archunit.core.domain.JavaClass;
import com.tngtech.archunit.core.domain.JavaClasses;
import com.tngtech.archunit.core.importer.ClassFileImporter;
import com.tngtech.archunit.core.importer.ImportOption;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.List;
import java.util.TreeSet;
import java.util.regex.Matcher;
import java.util.regex.Pattern;
import org.junit.jupiter.api.Test;

/**
 * DEVELOPERS.md's architecture map lists the packages so that each depends only on those above
 * it: read the table from the file and check every dependency of the compiled code against it.
 */
class PackageOrderTests {

    @Test
    void theArchitectureMapsOrderIsTheCodesOrder() throws Exception {
        Path home = Path.of(System.getProperty("lrbench.home", "."));
        List<String> order = new ArrayList<>();
        Matcher m = Pattern.compile("(?m)^\\| `([a-z.]+)` \\|").matcher(Files.readString(home.resolve("DEVELOPERS.md")));
        while (m.find()) {
            if (!order.contains(m.group(1))) {
                order.add(m.group(1));
            }
        }
        assertThat(order).contains("units", "analysis", "run", "cli");
        JavaClasses classes = new ClassFileImporter().withImportOption(ImportOption.Predefined.DO_NOT_INCLUDE_TESTS)
                .importPackages("org.lrbench");
        TreeSet<String> unlisted = new TreeSet<>();
        TreeSet<String> upward = new TreeSet<>();
        for (JavaClass c : classes) {
            String from = mapped(c.getPackageName(), order);
            if (from == null) {
                unlisted.add(c.getPackageName());
                continue;
            }
            for (Dependency d : c.getDirectDependenciesFromSelf()) {
                String to = mapped(d.getTargetClass().getPackageName(), order);
                if (to != null && order.indexOf(to) > order.indexOf(from)) {
                    upward.add(from + " -> " + to + " (" + c.getSimpleName() + " uses " + d.getTargetClass().getSimpleName() + ")");
                }
            }
        }
        assertThat(unlisted).as("packages missing from the map").isEmpty();
        assertThat(upward).as("dependencies pointing down the map").isEmpty();
    }

    /** The most specific listed package containing this one (sim.scpi before sim). */
    private static String mapped(String javaPackage, List<String> order) {
        if (!javaPackage.startsWith("org.lrbench.")) {
            return null;
        }
        String rest = javaPackage.substring("org.lrbench.".length());
        String best = null;
        for (String p : order) {
            if ((rest.equals(p) || rest.startsWith(p + ".")) && (best == null || p.length() > best.length())) {
                best = p;
            }
        }
        return best;
    }
}
