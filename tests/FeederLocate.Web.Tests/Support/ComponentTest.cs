using Bunit;
using Microsoft.AspNetCore.Components;

namespace FeederLocate.Web.Tests.Support;

/// <summary>A bUnit context rendering as the app does: interactive server rendering.</summary>
public abstract class ComponentTest : BunitContext
{
    protected ComponentTest()
    {
        SetRendererInfo(new RendererInfo("Server", isInteractive: true));
        JSInterop.Mode = JSRuntimeMode.Loose;
    }
}
