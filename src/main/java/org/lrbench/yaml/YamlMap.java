package org.lrbench.yaml;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;
import java.util.Optional;
import org.lrbench.units.Dimension;
import org.lrbench.units.Quantity;
import org.lrbench.units.UnitException;
import org.lrbench.units.Units;
import org.yaml.snakeyaml.nodes.MappingNode;
import org.yaml.snakeyaml.nodes.Node;
import org.yaml.snakeyaml.nodes.NodeTuple;
import org.yaml.snakeyaml.nodes.ScalarNode;
import org.yaml.snakeyaml.nodes.SequenceNode;

/**
 * A YAML mapping read key by key. Every accessor records a positioned {@link Problem} instead of
 * throwing, and returns {@code null} (or empty) for a value it could not read, so a loader reports
 * all problems of a file at once. Keys outside the allowed set are problems too.
 */
public final class YamlMap {
    private final Problems problems;
    private final MappingNode node;
    private final String path;
    private final Map<String, NodeTuple> entries = new LinkedHashMap<>();

    YamlMap(Problems problems, MappingNode node, String path, List<String> allowed) {
        this.problems = problems;
        this.node = node;
        this.path = path;
        for (NodeTuple tuple : node.getValue()) {
            Node keyNode = tuple.getKeyNode();
            if (!(keyNode instanceof ScalarNode)) {
                problems.add(keyNode, keyOf("?"), "keys must be plain words");
                continue;
            }
            String key = ((ScalarNode) keyNode).getValue();
            if (entries.containsKey(key)) {
                problems.add(keyNode, keyOf(key), "duplicate key");
            } else if (!allowed.contains(key)) {
                problems.add(keyNode, keyOf(key), "unknown key; allowed here: " + String.join(", ", allowed));
            } else {
                entries.put(key, tuple);
            }
        }
    }

    public Problems problems() {
        return problems;
    }

    public Node node() {
        return node;
    }

    /** The dotted path of a key under this mapping, as shown in problems. */
    public String keyOf(String key) {
        return path.isEmpty() ? key : path + "." + key;
    }

    public boolean has(String key) {
        return entries.containsKey(key);
    }

    /** The value node of a key, or empty; a missing required key is a problem. */
    public Optional<Node> value(String key, boolean required) {
        NodeTuple tuple = entries.get(key);
        if (tuple == null) {
            if (required) {
                problems.add(node, keyOf(key), "missing required key");
            }
            return Optional.empty();
        }
        return Optional.of(tuple.getValueNode());
    }

    /** A non-empty scalar text. */
    public String text(String key, boolean required) {
        return value(key, required).map(n -> scalar(n, keyOf(key))).orElse(null);
    }

    /** A quantity of one dimension, in SI base units. */
    public Double quantity(String key, Dimension dimension, boolean required) {
        return value(key, required).map(n -> quantityOf(n, keyOf(key), dimension)).orElse(null);
    }

    /** A quantity of any dimension or a percentage; the caller checks which it got. */
    public Quantity anyQuantity(String key, boolean required) {
        return value(key, required).map(n -> {
            String text = scalar(n, keyOf(key));
            if (text == null) {
                return null;
            }
            try {
                return Units.parse(text);
            } catch (UnitException e) {
                problems.add(n, keyOf(key), e.getMessage());
                return null;
            }
        }).orElse(null);
    }

    /** An integer within [min, max]. */
    public Integer integer(String key, boolean required, long min, long max) {
        return value(key, required).map(n -> {
            String text = scalar(n, keyOf(key));
            if (text == null) {
                return null;
            }
            try {
                long v = Long.parseLong(text.trim());
                if (v < min || v > max) {
                    problems.add(n, keyOf(key), "value " + v + " is out of range; allowed " + min + " to " + max);
                    return null;
                }
                return (int) v;
            } catch (NumberFormatException e) {
                problems.add(n, keyOf(key), "'" + text + "' is not a whole number; allowed " + min + " to " + max);
                return null;
            }
        }).orElse(null);
    }

    /** A whole number that may be large (a random seed). */
    public Long longValue(String key, boolean required) {
        return value(key, required).map(n -> {
            String text = scalar(n, keyOf(key));
            try {
                return text == null ? null : Long.parseLong(text.trim());
            } catch (NumberFormatException e) {
                problems.add(n, keyOf(key), "'" + text + "' is not a whole number");
                return null;
            }
        }).orElse(null);
    }

    /** One word out of a fixed set. */
    public <E> E choice(String key, boolean required, Map<String, E> choices) {
        return value(key, required).map(n -> {
            String text = scalar(n, keyOf(key));
            if (text == null) {
                return null;
            }
            E e = choices.get(text.trim());
            if (e == null) {
                problems.add(n, keyOf(key), "'" + text + "' is not allowed; allowed: " + String.join(", ", choices.keySet()));
            }
            return e;
        }).orElse(null);
    }

    /** A nested mapping with its own allowed keys. */
    public YamlMap map(String key, boolean required, String... allowed) {
        return value(key, required).map(n -> {
            if (!(n instanceof MappingNode)) {
                problems.add(n, keyOf(key), "expected a mapping of keys (" + String.join(", ", allowed) + ")");
                return null;
            }
            return new YamlMap(problems, (MappingNode) n, keyOf(key), List.of(allowed));
        }).orElse(null);
    }

    /** A sequence; its items are returned with their index path ("limits[2]"). */
    public List<Item> list(String key, boolean required) {
        List<Item> items = new ArrayList<>();
        value(key, required).ifPresent(n -> {
            if (!(n instanceof SequenceNode)) {
                problems.add(n, keyOf(key), "expected a list");
                return;
            }
            List<Node> nodes = ((SequenceNode) n).getValue();
            if (nodes.isEmpty()) {
                problems.add(n, keyOf(key), "the list is empty");
            }
            for (int i = 0; i < nodes.size(); i++) {
                items.add(new Item(nodes.get(i), keyOf(key) + "[" + i + "]"));
            }
        });
        return items;
    }

    /** An item of a sequence with its path. */
    public record Item(Node node, String path) {
    }

    /** Reads a sequence item as a mapping with its own allowed keys, or records a problem. */
    public YamlMap asMap(Item item, String... allowed) {
        if (!(item.node() instanceof MappingNode)) {
            problems.add(item.node(), item.path(), "expected a mapping of keys (" + String.join(", ", allowed) + ")");
            return null;
        }
        return new YamlMap(problems, (MappingNode) item.node(), item.path(), List.of(allowed));
    }

    /** Reads a sequence item as a quantity of one dimension. */
    public Double asQuantity(Item item, Dimension dimension) {
        return quantityOf(item.node(), item.path(), dimension);
    }

    /** Reads a sequence item as a single non-empty text. */
    public String asText(Item item) {
        return scalar(item.node(), item.path());
    }

    /** Records a problem at a sequence item. */
    public void problem(Item item, String message) {
        problems.add(item.node(), item.path(), message);
    }

    /** Records a problem at a key's value (or at this mapping when the key is absent). */
    public void problem(String key, String message) {
        NodeTuple tuple = entries.get(key);
        problems.add(tuple == null ? node : tuple.getValueNode(), keyOf(key), message);
    }

    private String scalar(Node n, String key) {
        if (!(n instanceof ScalarNode)) {
            problems.add(n, key, "expected a single value, not a list or mapping");
            return null;
        }
        String text = ((ScalarNode) n).getValue();
        if (text.isBlank()) {
            problems.add(n, key, "the value is empty");
            return null;
        }
        return text;
    }

    private Double quantityOf(Node n, String key, Dimension dimension) {
        String text = scalar(n, key);
        if (text == null) {
            return null;
        }
        try {
            double v = Units.parse(text, dimension);
            if (!Double.isFinite(v)) {
                problems.add(n, key, "'" + text + "' is not a finite number");
                return null;
            }
            return v;
        } catch (UnitException e) {
            problems.add(n, key, e.getMessage());
            return null;
        }
    }
}
