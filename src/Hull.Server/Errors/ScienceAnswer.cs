using Hull.Core.Thermo;

namespace Hull.Server.Errors;

/// <summary>Runs a call of the science layer and turns its input errors into INVALID_ARGUMENT naming the request field.</summary>
public static class ScienceAnswer
{
    public static T Of<T>(Func<T> call, Func<ThermoInputException, string> fieldOf)
    {
        try
        {
            return call();
        }
        catch (ThermoInputException e)
        {
            throw RpcErrors.InvalidArgument(fieldOf(e), e.Message);
        }
    }
}
