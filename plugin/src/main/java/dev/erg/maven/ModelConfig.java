package dev.erg.maven;

import java.util.LinkedHashMap;
import java.util.Map;

/**
 * One {@code <model>} element of the plugin configuration: the ONNX file, the values of its symbolic
 * dimensions, and optionally its own budget, which overrides the plugin's {@code <budget>} limit by
 * limit.
 *
 * <pre>
 * &lt;model&gt;
 *   &lt;file&gt;src/main/onnx/feeder.onnx&lt;/file&gt;
 *   &lt;dimensions&gt;&lt;batch&gt;1&lt;/batch&gt;&lt;/dimensions&gt;
 *   &lt;budget&gt;&lt;maxLatencyMs&gt;80&lt;/maxLatencyMs&gt;&lt;/budget&gt;
 * &lt;/model&gt;
 * </pre>
 */
public class ModelConfig {
    /** The ONNX file, relative to the project's base directory unless absolute. */
    private String file;

    /** Values for the model's symbolic dimensions ({@code dim_param}), e.g. {@code <batch>1</batch>}. */
    private Map<String, String> dimensions = new LinkedHashMap<>();

    /** This model's own limits; each one set overrides the plugin's {@code <budget>} and the device's. */
    private BudgetConfig budget;

    public ModelConfig() {
    }

    public ModelConfig(String file, Map<String, String> dimensions) {
        this.file = file;
        this.dimensions = new LinkedHashMap<>(dimensions);
    }

    public String getFile() {
        return file;
    }

    public void setFile(String file) {
        this.file = file;
    }

    public Map<String, String> getDimensions() {
        return dimensions;
    }

    public void setDimensions(Map<String, String> dimensions) {
        this.dimensions = dimensions;
    }

    public BudgetConfig getBudget() {
        return budget;
    }

    public void setBudget(BudgetConfig budget) {
        this.budget = budget;
    }
}
