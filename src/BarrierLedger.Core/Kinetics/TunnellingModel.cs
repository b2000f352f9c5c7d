using BarrierLedger.Core.Units;

namespace BarrierLedger.Core.Kinetics;

/// <summary>The tunnelling transmission coefficient κ(T) of one step, evaluated at whatever temperature a simulation is at.</summary>
public abstract record TunnellingModel
{
    /// <summary>κ at <paramref name="temperatureKelvin"/>.</summary>
    public abstract double Kappa(double temperatureKelvin);

    /// <summary>Plain description for tables and notes.</summary>
    public abstract string Describe();
}

/// <summary>κ held at a fixed value at every temperature (e.g. the stored κ of a derivation at its own temperature).</summary>
public sealed record FixedTunnelling(double Value) : TunnellingModel
{
    public override double Kappa(double temperatureKelvin) =>
        Value > 0 && double.IsFinite(Value) ? Value : throw new ArgumentException($"κ must be positive and finite, got {Value}.", nameof(Value));

    public override string Describe() => $"κ = {Value:0.###} (fixed)";
}

/// <summary>Wigner's κ(T) = 1 + (1/24)(h c |ν̃‡| / k_B T)² (<see cref="Tunnelling.Wigner"/>).</summary>
public sealed record WignerTunnelling(double ImaginaryFrequencyCm1) : TunnellingModel
{
    public override double Kappa(double temperatureKelvin) => Tunnelling.Wigner(ImaginaryFrequencyCm1, temperatureKelvin);

    public override string Describe() => $"Wigner, ν‡ = {Math.Abs(ImaginaryFrequencyCm1):0}i cm⁻¹";
}

/// <summary>
/// Skodje–Truhlar κ(T) for a parabolic barrier (<see cref="Tunnelling.SkodjeTruhlar"/>) with the step's zero-point-corrected
/// electronic barriers, which do not change with temperature.
/// </summary>
public sealed record SkodjeTruhlarTunnelling(double ImaginaryFrequencyCm1, Energy ForwardBarrier, Energy ReverseBarrier) : TunnellingModel
{
    public override double Kappa(double temperatureKelvin) =>
        Tunnelling.SkodjeTruhlar(ImaginaryFrequencyCm1, ForwardBarrier, ReverseBarrier, temperatureKelvin);

    public override string Describe() => $"Skodje–Truhlar, ν‡ = {Math.Abs(ImaginaryFrequencyCm1):0}i cm⁻¹";
}
