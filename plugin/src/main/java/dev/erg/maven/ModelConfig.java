package dev.erg.maven;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
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
 *   &lt;shapes&gt;&lt;input&gt;1x576&lt;/input&gt;&lt;/shapes&gt;
 *   &lt;values&gt;&lt;sr&gt;16000&lt;/sr&gt;&lt;/values&gt;
 *   &lt;precision&gt;&lt;rule&gt;/backbone/*@Conv=w4a8&lt;/rule&gt;&lt;/precision&gt;
 *   &lt;sweeps&gt;&lt;sweep&gt;seq=64..1024:64&lt;/sweep&gt;&lt;/sweeps&gt;
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
    /** Whole shapes of graph inputs, dims joined by {@code x}, e.g. {@code <input>1x576</input>}. */
    private Map<String, String> shapes = new LinkedHashMap<>();

    /** Constant values of small graph inputs, e.g. {@code <sr>16000</sr>} or {@code <ids>1,2,3</ids>}. */
    private Map<String, String> values = new LinkedHashMap<>();

    /**
     * Precision rules, in order, each {@code PATTERN[@OP]=wNaM}, e.g. {@code <rule>/backbone/*@Conv=w4a8</rule>};
     * the first rule that matches a node sets its deployed precision on every device.
     */
    private List<String> precision = new ArrayList<>();

    /**
     * A sweep of one symbolic dimension, {@code NAME=FROM..TO:STEP} or {@code NAME=FROM..TO*FACTOR},
     * e.g. {@code <sweeps><sweep>seq=64..1024:64</sweep></sweeps>}; at most one per model.
     */
    private java.util.List<String> sweeps = new java.util.ArrayList<>();

    public java.util.List<String> getSweeps() {
        return sweeps;
    }

    public void setSweeps(java.util.List<String> sweeps) {
        this.sweeps = sweeps;
    }

    private String measured;

    /** The model's measurement file (CSV, docs/calibration.md), read by the calibrate goal; or null. */
    public String getMeasured() {
        return measured;
    }

    public void setMeasured(String measured) {
        this.measured = measured;
    }

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

    public Map<String, String> getShapes() {
        return shapes;
    }

    public void setShapes(Map<String, String> shapes) {
        this.shapes = shapes;
    }

    public Map<String, String> getValues() {
        return values;
    }

    public void setValues(Map<String, String> values) {
        this.values = values;
    }

    public List<String> getPrecision() {
        return precision;
    }

    public void setPrecision(List<String> precision) {
        this.precision = precision;
    }
}
