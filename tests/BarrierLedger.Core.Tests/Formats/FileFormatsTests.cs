using System.Text;
using BarrierLedger.Core.Formats;

namespace BarrierLedger.Core.Tests.Formats;

public class FileFormatsTests
{
    [Theory]
    [InlineData("a.xyz", "3\n\nO 0 0 0", FileFormat.Xyz)]
    [InlineData("a.extxyz", "1\nProperties=species:S:1:pos:R:3\nH 0 0 0", FileFormat.Xyz)]
    [InlineData("scan.csv", "r,energy\n1,2", FileFormat.CsvScan)]
    [InlineData("scan.tsv", "r\tenergy", FileFormat.CsvScan)]
    [InlineData("run.json", "{\"schema_name\": \"qcschema_output\"}", FileFormat.QcSchema)]
    [InlineData("result.out", "  {\n \"schema_name\": \"qcschema_output\"}", FileFormat.QcSchema)]
    [InlineData("bundle.json", "{\"format\": \"barrierledger-bundle\"}", FileFormat.Bundle)]
    [InlineData("upload.bin", "PK\u0003\u0004rest", FileFormat.BundleZip)]
    [InlineData("notes.docx", "hello", FileFormat.Unknown)]
    public void Format_is_told_from_content_first_then_extension(string name, string head, FileFormat expected) =>
        Assert.Equal(expected, FileFormats.Detect(name, Encoding.UTF8.GetBytes(head)));
}
