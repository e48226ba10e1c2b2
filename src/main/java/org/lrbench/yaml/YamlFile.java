package org.lrbench.yaml;

import java.io.IOException;
import java.io.Reader;
import java.io.StringReader;
import java.nio.charset.StandardCharsets;
import java.nio.file.Files;
import java.nio.file.Path;
import java.util.List;
import org.yaml.snakeyaml.LoaderOptions;
import org.yaml.snakeyaml.Yaml;
import org.yaml.snakeyaml.constructor.SafeConstructor;
import org.yaml.snakeyaml.error.MarkedYAMLException;
import org.yaml.snakeyaml.error.YAMLException;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;

/**
 * Reads a YAML file into SnakeYAML's node tree, which keeps the line and column of every value, and
 * hands back its top-level mapping. Syntax errors become {@link Problem}s with their position.
 */
public final class YamlFile {

    private YamlFile() {
    }

    /** The largest YAML file read: far above any plan, bench, driver or lot file. */
    public static final long MAX_BYTES = 1024 * 1024;

    /** Composes the file's single document; the top level must be a mapping. */
    public static YamlMap read(Path path, Problems problems, String... allowedKeys) throws ProblemsException {
        String text;
        try {
            long size = Files.size(path);
            if (size > MAX_BYTES) {
                // refused before it is read: plans, benches, drivers and lots are small files
                problems.add((Node) null, "(file)", "is " + size + " bytes; a file lrbench reads is at most " + MAX_BYTES
                        + " bytes (1 MiB)");
                problems.throwIfAny();
            }
            byte[] bytes = Files.readAllBytes(path);
            String notUtf8 = TextEncoding.problem(bytes);
            if (notUtf8 != null) {
                problems.add((Node) null, "(file)", notUtf8);
                problems.throwIfAny();
            }
            text = new String(bytes, StandardCharsets.UTF_8);
            if (text.startsWith("\uFEFF")) {
                text = text.substring(1); // a UTF-8 byte order mark: allowed, not part of the text
            }
        } catch (IOException e) {
            problems.add((Node) null, "(file)", "cannot read: " + e.getMessage());
            problems.throwIfAny();
            return null;
        }
        return parse(text, problems, allowedKeys);
    }

    /** Composes YAML text; the name used in problems is the one {@code problems} was made with. */
    public static YamlMap parse(String text, Problems problems, String... allowedKeys) throws ProblemsException {
        LoaderOptions options = new LoaderOptions();
        options.setAllowDuplicateKeys(false);
        options.setMaxAliasesForCollections(10);
        options.setCodePointLimit(4 * 1024 * 1024);
        Yaml yaml = new Yaml(new SafeConstructor(options));
        Node root;
        try (Reader reader = new StringReader(text)) {
            root = yaml.compose(reader);
        } catch (MarkedYAMLException e) {
            problems.add(e.getProblemMark(), "(yaml)", "malformed YAML: " + e.getProblem());
            problems.throwIfAny();
            return null;
        } catch (YAMLException | IOException e) {
            problems.add((Node) null, "(yaml)", "malformed YAML: " + e.getMessage());
            problems.throwIfAny();
            return null;
        }
        if (!(root instanceof MappingNode)) {
            problems.add(root, "(document)", root == null ? "the file is empty; expected a mapping of keys"
                    : "the top level must be a mapping of keys");
            problems.throwIfAny();
        }
        return new YamlMap(problems, (MappingNode) root, "", List.of(allowedKeys));
    }
}
